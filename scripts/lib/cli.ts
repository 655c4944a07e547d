// What the metrics, flex and beam commands share: options parsed by node:util's parseArgs
// (an unknown or malformed one exits 2 with its message), -h/--help prints the usage, exactly one
// input named on the command line, and every failure as one line "<command>: <message>" on stderr.
import { parseArgs, type ParseArgsConfig } from "node:util";

/** Declare it with this type (`const fail: Fail = failWith("flex")`) so TypeScript knows it never returns. */
export type Fail = (message: string, code?: number) => never;

export function failWith(command: string): Fail {
  return (message, code = 1) => {
    process.stderr.write(`${command}: ${message.replace(/\s+/g, " ").trim()}\n`);
    process.exit(code);
  };
}

type Options = NonNullable<ParseArgsConfig["options"]>;

export function startCommand<const O extends Options>(c: { fail: Fail; usage: string; options: O; input: string }) {
  const fail: Fail = c.fail;
  const parse = () => parseArgs({ allowPositionals: true, options: { ...c.options, help: { type: "boolean", short: "h" } } as O & { help: { type: "boolean"; short: "h" } } });
  let args: ReturnType<typeof parse> | undefined;
  try {
    args = parse();
  } catch (err) {
    fail(`${(err as Error).message} (try --help)`, 2);
  }
  if ((args.values as { help?: boolean }).help) {
    process.stdout.write(`${c.usage}\n`);
    process.exit(0);
  }
  if (args.positionals.length !== 1) fail(`give exactly one ${c.input} (try --help)`, 2);
  return { values: args.values, input: args.positionals[0] };
}
