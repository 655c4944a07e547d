// Copies every stored clip object between the configured storage (STORAGE=s3: the bucket) and a
// plain folder, for scripts/backup (pull) and scripts/restore (push). Local-disk storage is
// archived by tar directly and does not need this.
//   node --import tsx scripts/lib/media-sync.ts pull <folder>
//   node --import tsx scripts/lib/media-sync.ts push <folder>
import { createReadStream, createWriteStream } from "node:fs";
import { mkdir, readdir } from "node:fs/promises";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import { storage } from "../../server/clips/deps";

const PREFIX = "clips/";

async function pull(dir: string) {
  const st = storage();
  let n = 0;
  for (const o of await st.list(PREFIX)) {
    const file = path.join(dir, ...o.key.split("/"));
    await mkdir(path.dirname(file), { recursive: true });
    await pipeline((await st.get(o.key)).body, createWriteStream(file));
    n++;
  }
  return n;
}

async function* filesUnder(root: string, rel = ""): AsyncGenerator<string> {
  for (const d of await readdir(path.join(root, rel), { withFileTypes: true })) {
    const r = rel ? `${rel}/${d.name}` : d.name;
    if (d.isDirectory()) yield* filesUnder(root, r);
    else if (d.isFile()) yield r;
  }
}

const typeOf = (key: string) => (key.endsWith(".jpg") ? "image/jpeg" : key.endsWith(".webp") ? "image/webp" : undefined);

async function push(dir: string) {
  const st = storage();
  let n = 0;
  for await (const key of filesUnder(path.join(dir, "clips"), "")) {
    const full = `${PREFIX}${key}`;
    await st.putStream(full, createReadStream(path.join(dir, "clips", ...key.split("/"))), { contentType: typeOf(full) });
    n++;
  }
  return n;
}

const [cmd, dir] = process.argv.slice(2);
if ((cmd !== "pull" && cmd !== "push") || !dir) {
  console.error("usage: media-sync.ts pull|push <folder>");
  process.exit(2);
}
const n = cmd === "pull" ? await pull(path.resolve(dir)) : await push(path.resolve(dir));
console.log(`${n} objects ${cmd === "pull" ? "copied from" : "copied to"} the object store`);
