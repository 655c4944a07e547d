// The bits that carry the picture in a PNG frame: its sBIT chunk (PNG specification, 11.3.3.4),
// which a camera writing 12-bit data into 16-bit samples sets to 12. ffmpeg 5.1's PNG decoder does
// not report it, so the sequence check reads it from the first frame itself (decision 138).
import { open } from "node:fs/promises";

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
/** Chunks before the image data fit well within this; sBIT must come before IDAT. */
const HEAD_BYTES = 64 * 1024;

/** The most significant bits of any channel the PNG declares, or null (no sBIT, or not a PNG). */
export async function pngSignificantBits(file: string): Promise<number | null> {
  const fh = await open(file, "r");
  try {
    const buf = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await fh.read(buf, 0, HEAD_BYTES, 0);
    const b = buf.subarray(0, bytesRead);
    if (b.length < 8 || !b.subarray(0, 8).equals(SIGNATURE)) return null;
    for (let at = 8; at + 8 <= b.length; ) {
      const length = b.readUInt32BE(at);
      const type = b.toString("latin1", at + 4, at + 8);
      if (type === "IDAT" || type === "IEND") return null;
      const data = b.subarray(at + 8, at + 8 + length);
      if (type === "sBIT") return data.length && data.length === length ? Math.max(...data) : null;
      at += 12 + length;
    }
    return null;
  } finally {
    await fh.close();
  }
}
