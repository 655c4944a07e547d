// Reading an uploaded ZIP of numbered frames as hostile input (yauzl): the entry count and the
// total unpacked size are capped from the central directory before one byte is unpacked; names
// that climb out (../, absolute), links and encrypted entries refuse the whole archive; only the
// frames are unpacked, each under a name of ours (its index), never under the archive's name;
// yauzl checks each entry unpacks to exactly its declared size, so the caps cannot be lied past.
import { createWriteStream } from "node:fs";
import { open as openFile, statfs } from "node:fs/promises";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import yauzl, { type Entry, type ZipFile } from "yauzl";
import { MediaInputError } from "../../media/errors";
import { planSequence, type SequencePlan } from "./names";
import { bytesText } from "../../../shared/bytes";

export interface ArchiveLimits {
  /** Most entries (files and folders) an archive may list. */
  maxEntries: number;
  /** Most bytes the frames may unpack to, together. */
  maxUnpackedBytes: number;
}

export interface UnpackedSequence extends SequencePlan {
  /** image2 pattern of the unpacked frames: <dir>/%08d.<type>, numbered from 0. */
  pattern: string;
  unpackedBytes: number;
}

/** A ZIP starts with a local file header (PK\3\4), or is an empty archive (PK\5\6). */
export async function looksLikeZip(file: string): Promise<boolean> {
  const fh = await openFile(file, "r");
  try {
    const head = Buffer.alloc(4);
    const { bytesRead } = await fh.read(head, 0, 4, 0);
    return bytesRead === 4 && head.readUInt32LE(0) === 0x04034b50;
  } finally {
    await fh.close();
  }
}

const S_IFMT = 0o170000;
const S_IFLNK = 0o120000;
/** Unix file type from the upper half of the external attributes (zip "version made by" Unix). */
const isLink = (e: Entry) => e.versionMadeBy >> 8 === 3 && ((e.externalFileAttributes >>> 16) & S_IFMT) === S_IFLNK;

const unsafe = (message: string, file?: string) =>
  new MediaInputError("sequence_unsafe_archive", `This ZIP cannot be used: ${message}. Nothing was stored.`, file ? { file } : {});

async function openZip(file: string): Promise<ZipFile> {
  try {
    return await yauzl.openPromise(file, { lazyEntries: true, autoClose: false, decodeStrings: true, validateEntrySizes: true, strictFileNames: false });
  } catch (err) {
    throw unsafe(`it is damaged or not a ZIP archive (${(err as Error).message})`);
  }
}

/** Every entry's listing, checked; yauzl refuses names with ../ or an absolute path while listing. */
async function listEntries(zip: ZipFile, limits: ArchiveLimits): Promise<Entry[]> {
  if (zip.entryCount > limits.maxEntries)
    throw new MediaInputError(
      "sequence_too_large",
      `This ZIP lists ${zip.entryCount.toLocaleString("en")} entries; a sequence can have at most ${limits.maxEntries.toLocaleString("en")}. Split the run or trim it around the shot.`,
      { entries: zip.entryCount, maxEntries: limits.maxEntries },
    );
  const entries: Entry[] = [];
  try {
    for await (const entry of zip.eachEntry()) {
      if (isLink(entry)) throw unsafe(`${entry.fileName} is a link, not a frame`, entry.fileName);
      if (entry.isEncrypted()) throw unsafe(`${entry.fileName} is encrypted`, entry.fileName);
      entries.push(entry);
    }
  } catch (err) {
    if (err instanceof MediaInputError) throw err;
    // yauzl's messages name the entry ("invalid relative path: ../x", "absolute path: /x", …).
    throw unsafe((err as Error).message);
  }
  return entries;
}

/**
 * Unpack the frames of the sequence in `file` into `dir` as 00000000.<type>, 00000001.<type> …
 * in frame order. Throws MediaInputError for anything unsafe, too large, or not one numbered run.
 */
export async function unpackSequence(file: string, dir: string, limits: ArchiveLimits): Promise<UnpackedSequence> {
  const zip = await openZip(file);
  try {
    const entries = await listEntries(zip, limits);
    const files = entries.filter((e) => !e.fileName.endsWith("/"));
    const plan = planSequence(files.map((e) => e.fileName));
    const byName = new Map(files.map((e) => [e.fileName, e]));
    const frames = plan.frames.map((f) => byName.get(f.name)!);

    const unpackedBytes = frames.reduce((sum, e) => sum + e.uncompressedSize, 0);
    if (unpackedBytes > limits.maxUnpackedBytes)
      throw new MediaInputError(
        "sequence_too_large",
        `The frames in this ZIP unpack to ${bytesText(unpackedBytes)}; a sequence can unpack to at most ${bytesText(limits.maxUnpackedBytes)}. Trim the run around the shot.`,
        { unpackedBytes, maxUnpackedBytes: limits.maxUnpackedBytes },
      );
    const free = await statfs(dir).then((s) => s.bavail * s.bsize).catch(() => Infinity);
    // The frames, then their copy into one video file, and room to spare.
    if (free < unpackedBytes * 2 + 512 * 1024 ** 2)
      throw Object.assign(new Error("not enough disk space to unpack the sequence"), { code: "ENOSPC" });

    for (let i = 0; i < frames.length; i++) {
      const entry = frames[i];
      const out = path.join(dir, `${String(i).padStart(8, "0")}.${plan.type}`);
      try {
        await pipeline(await zip.openReadStreamPromise(entry), createWriteStream(out, { flags: "wx" }));
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code;
        if (code === "ENOSPC" || code === "EDQUOT") throw err;
        throw new MediaInputError("sequence_unreadable_image", `${entry.fileName} cannot be unpacked from the ZIP (${(err as Error).message}). Nothing was stored.`, {
          file: entry.fileName,
        });
      }
    }
    return { ...plan, pattern: path.join(dir, `%08d.${plan.type}`), unpackedBytes };
  } finally {
    zip.close();
  }
}

