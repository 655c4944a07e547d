// A folder picked in the browser becomes one ZIP that the server's reader takes apart again
// (decision 134): frames only, under their paths, bytes unchanged, the same bytes every time.
import { mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { frameFiles, folderName, isSequenceFile, zipFrames } from "../../../src/features/clips/upload/folderZip";
import { unpackSequence } from "../../../server/clips/sequence/archive";
import { readFileSync } from "node:fs";

const picked = (rel: string, bytes: number[]) => {
  const f = new File([new Uint8Array(bytes)], rel.split("/").pop()!, { lastModified: Date.UTC(2026, 11, 3) });
  Object.defineProperty(f, "webkitRelativePath", { value: rel });
  return f;
};

describe("zipFrames", () => {
  it("zips the frames of a picked folder so the server unpacks them in order, unchanged", async () => {
    const files = [picked("run 12/r_2.png", [2, 2]), picked("run 12/r_1.png", [1]), picked("run 12/notes.txt", [9]), picked("run 12/.DS_Store", [0])];
    const frames = frameFiles(files);
    expect(frames.map((f) => f.name)).toEqual(["r_2.png", "r_1.png"]);
    expect(folderName(files)).toBe("run 12");
    const zip = await zipFrames(frames, folderName(files));
    expect(zip.name).toBe("run 12.zip");
    expect(isSequenceFile(zip)).toBe(true);
    const again = await zipFrames(frames, "run 12");
    expect(Buffer.from(await again.arrayBuffer()).equals(Buffer.from(await zip.arrayBuffer()))).toBe(true);

    const dir = mkdtempSync(path.join(os.tmpdir(), "lf-folder-zip-"));
    const file = path.join(dir, "up.zip");
    writeFileSync(file, Buffer.from(await zip.arrayBuffer()));
    const out = mkdtempSync(path.join(os.tmpdir(), "lf-folder-out-"));
    const seq = await unpackSequence(file, out, { maxEntries: 10, maxUnpackedBytes: 1000 });
    expect(seq.frames.map((f) => f.name)).toEqual(["run 12/r_1.png", "run 12/r_2.png"]);
    expect([...readFileSync(path.join(out, "00000001.png"))]).toEqual([2, 2]);
  });
});
