// The hostile-archive caps of unpackSequence (decision 134), on ZIPs made here with fflate:
// entry count and unpacked size are refused from the central directory, before unpacking.
import { mkdtempSync, readdirSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { zipSync, type Zippable } from "fflate";
import { describe, expect, it } from "vitest";
import { looksLikeZip, unpackSequence } from "../../../server/clips/sequence/archive";

const tmp = () => mkdtempSync(path.join(os.tmpdir(), "lf-seq-unit-"));
function zipFile(entries: Zippable, level: 0 | 9 = 0) {
  const f = path.join(tmp(), "a.zip");
  writeFileSync(f, zipSync(entries, { level }));
  return f;
}
const bytes = (n: number, fill = 0) => new Uint8Array(n).fill(fill);
const limits = { maxEntries: 1000, maxUnpackedBytes: 10 * 1024 ** 2 };

describe("unpackSequence", () => {
  it("unpacks frames under its own names, in frame order", async () => {
    const dir = tmp();
    const seq = await unpackSequence(zipFile({ "r_10.png": bytes(3, 10), "r_9.png": bytes(2, 9), "notes.txt": bytes(1) }), dir, limits);
    expect(readdirSync(dir).sort()).toEqual(["00000000.png", "00000001.png"]);
    expect(seq.pattern).toBe(path.join(dir, "%08d.png"));
    expect(seq.unpackedBytes).toBe(5);
    expect(seq.skipped).toEqual(["notes.txt"]);
  });

  it("a ZIP bomb (12 MB of zeros deflated to a few kB, over a 10 MB cap) is refused before anything is unpacked", async () => {
    const dir = tmp();
    const f = zipFile({ "r_1.tif": bytes(6 * 1024 ** 2), "r_2.tif": bytes(6 * 1024 ** 2) }, 9);
    await expect(unpackSequence(f, dir, limits)).rejects.toMatchObject({ code: "sequence_too_large", message: expect.stringContaining("unpack to") });
    expect(readdirSync(dir)).toEqual([]);
  });

  it("too many entries are refused from the count alone", async () => {
    const entries: Zippable = {};
    for (let i = 1; i <= 30; i++) entries[`r_${i}.png`] = bytes(1);
    await expect(unpackSequence(zipFile(entries), tmp(), { ...limits, maxEntries: 20 })).rejects.toMatchObject({ code: "sequence_too_large", message: expect.stringContaining("30 entries") });
  });

  it("absolute names and encrypted-looking damage are refused as unsafe", async () => {
    await expect(unpackSequence(zipFile({ "/etc/r_1.png": bytes(1), "/etc/r_2.png": bytes(1) }), tmp(), limits)).rejects.toMatchObject({ code: "sequence_unsafe_archive" });
    const notZip = path.join(tmp(), "x.zip");
    writeFileSync(notZip, "PK\u0003\u0004 and then nothing that makes sense");
    expect(await looksLikeZip(notZip)).toBe(true);
    await expect(unpackSequence(notZip, tmp(), limits)).rejects.toMatchObject({ code: "sequence_unsafe_archive", message: expect.stringContaining("damaged or not a ZIP") });
  });
});
