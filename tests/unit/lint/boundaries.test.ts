// The layering rules (docs/decisions/120-layering-rules.md) are ESLint rules: each deliberate
// forbidden import below must be reported, and the allowed twin must pass. Files are linted as
// text under a path of the tree, so nothing is written to it.
import { ESLint } from "eslint";
import { beforeAll, describe, expect, it } from "vitest";

let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: process.cwd() });
});

async function ruleIds(filePath: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.map((m) => m.ruleId ?? m.message);
}

describe("import boundaries", { timeout: 60_000 }, () => {
  it("a feature importing another feature fails", async () => {
    expect(await ruleIds("src/features/clips/boundary-probe.ts", `import { readoutQueryOptions } from "@/features/readout/api/readout";\nexport const k = readoutQueryOptions;\n`)).toContain(
      "import-x/no-restricted-paths",
    );
    expect(await ruleIds("src/features/clips/boundary-probe.ts", `import { readoutQueryOptions } from "../readout/api/readout";\nexport const k = readoutQueryOptions;\n`)).toContain(
      "import-x/no-restricted-paths",
    );
  });

  it("a feature importing its own files, an entity, shared UI and lib passes", async () => {
    expect(
      await ruleIds("src/features/clips/boundary-probe.ts", `import { clipQueryOptions } from "./api/clip";\nimport { shotKeys } from "@/entities/shot";\nimport { Button } from "@/components/ui";\nexport const k = [clipQueryOptions, shotKeys, Button];\n`),
    ).toEqual([]);
  });

  it("an entity importing a feature fails", async () => {
    expect(await ruleIds("src/entities/shot/boundary-probe.ts", `import { readoutQueryOptions } from "@/features/readout/api/readout";\nexport const k = readoutQueryOptions;\n`)).toContain(
      "import-x/no-restricted-paths",
    );
  });

  it("shared UI importing a feature fails", async () => {
    expect(await ruleIds("src/components/ui/boundary-probe.ts", `import { clipQueryOptions } from "@/features/clips/api/clip";\nexport const k = clipQueryOptions;\n`)).toContain(
      "import-x/no-restricted-paths",
    );
  });

  it("Drizzle outside an entity repository or server/db fails", async () => {
    expect(await ruleIds("server/readout/routes.ts", `import { sql } from "drizzle-orm";\nexport const q = sql\`select 1\`;\n`)).toContain("no-restricted-imports");
    // A feature's own repository is no exception any more (decision 126): its queries live in the entity.
    expect(await ruleIds("server/clips/repository.ts", `import { sql } from "drizzle-orm";\nexport const q = sql\`select 1\`;\n`)).toContain("no-restricted-imports");
    expect(await ruleIds("server/entities/shot/repository.ts", `import { sql } from "drizzle-orm";\nexport const q = sql\`select 1\`;\n`)).toEqual([]);
  });

  it("shared/ with Node I/O or the DOM fails", async () => {
    expect(await ruleIds("shared/mechanics/boundary-probe.ts", `import { readFileSync } from "node:fs";\nexport const r = readFileSync;\n`)).toContain("no-restricted-imports");
    expect(await ruleIds("shared/mechanics/boundary-probe.ts", `export const title = () => document.title;\n`)).toContain("no-restricted-globals");
    expect(await ruleIds("shared/mechanics/boundary-probe.ts", `export const pure = (x: number) => x * 2;\n`)).toEqual([]);
  });
});
