// Loading OpenCV's JavaScript build: it must not hang on its thenable, and must leave no
// process-wide handlers behind (it installs two). Run in a fresh Node process so the load is real.
// [CP] common practice, no source: the handlers are what the package's Emscripten loader adds.
import { execa } from "execa";
import { expect, it } from "vitest";

const script = `
const events = ["uncaughtException", "unhandledRejection"];
const count = () => events.map((e) => process.listeners(e).length);
const before = count();
const { loadOpenCv } = await import("./shared/tracking/opencv.ts");
const { cv } = await loadOpenCv();
const again = await loadOpenCv();
const after = count();
// An unhandled rejection elsewhere must not abort the WebAssembly runtime.
process.on("unhandledRejection", () => {});
Promise.reject(new Error("somebody else's"));
await new Promise((r) => setTimeout(r, 20));
const m = new cv.Mat(3, 4, cv.CV_8UC1);
const rows = m.rows;
m.delete();
console.log(JSON.stringify({ before, after, same: again.cv === cv, rows }));
`;

it("loads once, leaves the process handlers as they were, and survives others' rejections", async () => {
  const { stdout } = await execa("node", ["--import", "tsx", "--input-type=module", "-e", script], { timeout: 60_000 });
  expect(JSON.parse(stdout.trim().split("\n").at(-1)!)).toEqual({ before: [0, 0], after: [0, 0], same: true, rows: 3 });
}, 60_000);
