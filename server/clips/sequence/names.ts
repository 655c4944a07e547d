// An image sequence's frame order comes from its file names only (lab cameras number them:
// run12_000001.tif …). Pure: decides which entries are frames, in what order, and refuses —
// naming the file — anything that is not one unbroken numbered run of one image type.

import { MediaInputError } from "../../media/errors";

/** Image types a sequence may hold, by extension; the value is what ffmpeg's image2 reads. */
const imageTypes: Record<string, SequenceImageType> = { png: "png", tif: "tif", tiff: "tif", jpg: "jpg", jpeg: "jpg" };
export type SequenceImageType = "png" | "tif" | "jpg";
export const imageTypeLabel: Record<SequenceImageType, string> = { png: "PNG", tif: "TIFF", jpg: "JPEG" };

export interface SequenceFrameName {
  /** The entry's name in the archive (shown in messages, never used as a path). */
  name: string;
  number: number;
}

export interface SequencePlan {
  type: SequenceImageType;
  /** In frame order: first, second, … */
  frames: SequenceFrameName[];
  /** Entries that are not frames (a camera's settings file, notes): never extracted. */
  skipped: string[];
}

// Folders and files an operating system adds to archives on its own (from memory: macOS's
// __MACOSX/ and ._ files, .DS_Store; Windows' Thumbs.db and desktop.ini).
const systemClutter = (name: string) => /(^|\/)__MACOSX\//.test(name) || /(^|\/)(\.[^/]*|Thumbs\.db|desktop\.ini)$/i.test(name);

const extensionOf = (base: string) => /\.([A-Za-z0-9]+)$/.exec(base)?.[1].toLowerCase() ?? "";
const folderOf = (name: string) => name.slice(0, name.lastIndexOf("/") + 1);
const baseOf = (name: string) => name.slice(name.lastIndexOf("/") + 1);

/** "cam1/run12_000042_L.tif" → { stem: "cam1/run12_", digits: "000042", tail: "_L" }: the last run of digits is the frame number; the extension is not part of it. */
export function splitNumber(name: string): { stem: string; digits: string; tail: string } | null {
  const base = baseOf(name).replace(/\.[A-Za-z0-9]+$/, "");
  const m = /^(.*?)(\d+)(\D*)$/.exec(base);
  if (!m) return null;
  return { stem: folderOf(name) + m[1], digits: m[2], tail: m[3] };
}

/**
 * Plan a sequence from the archive's file entries (folders already left out). Refuses: no image,
 * images of two types, frames in two folders or of two name patterns, a frame without a number,
 * two files with one number, and a gap in the numbering.
 */
export function planSequence(entryNames: readonly string[]): SequencePlan {
  const skipped: string[] = [];
  const images: { name: string; type: SequenceImageType }[] = [];
  for (const name of entryNames) {
    if (systemClutter(name)) continue;
    const type = imageTypes[extensionOf(baseOf(name))];
    if (type) images.push({ name, type });
    else skipped.push(name);
  }
  if (images.length === 0) {
    const held = skipped.slice(0, 3).join(", ");
    throw new MediaInputError(
      "sequence_not_images",
      `This ZIP holds no PNG, TIFF or JPEG frames${held ? ` (it holds ${held}${skipped.length > 3 ? ", …" : ""})` : ""}. Put the numbered frames of one shot in the ZIP.`,
    );
  }
  const type = images[0].type;
  const other = images.find((i) => i.type !== type);
  if (other)
    throw new MediaInputError(
      "sequence_mixed",
      `This ZIP mixes ${imageTypeLabel[type]} frames (${images[0].name}) with ${imageTypeLabel[other.type]} ones (${other.name}). A sequence is one camera run of one image type.`,
      { file: other.name },
    );

  const frames: (SequenceFrameName & { stem: string; tail: string })[] = [];
  for (const { name } of images) {
    const parts = splitNumber(name);
    if (!parts)
      throw new MediaInputError("sequence_unnumbered", `${name} has no frame number in its name. Frames must be numbered (e.g. run_0001.png, run_0002.png, …).`, { file: name });
    frames.push({ name, number: Number(parts.digits), stem: parts.stem, tail: parts.tail });
  }
  const first = frames[0];
  const stranger = frames.find((f) => f.stem !== first.stem || f.tail !== first.tail);
  if (stranger)
    throw new MediaInputError(
      "sequence_mixed",
      `${stranger.name} does not belong to the same run as ${first.name} (another folder or name). Put one camera run per ZIP.`,
      { file: stranger.name },
    );

  frames.sort((a, b) => a.number - b.number);
  if (frames.length < 2)
    throw new MediaInputError("sequence_too_short", `This ZIP holds one frame (${first.name}); a sequence needs at least two.`, { file: first.name });
  for (let i = 1; i < frames.length; i++) {
    const prev = frames[i - 1];
    const cur = frames[i];
    if (cur.number === prev.number)
      throw new MediaInputError("sequence_mixed", `${prev.name} and ${cur.name} carry the same frame number (${cur.number}).`, { file: cur.name });
    if (cur.number !== prev.number + 1) {
      const from = prev.number + 1;
      const to = cur.number - 1;
      throw new MediaInputError(
        "sequence_gap",
        `The numbering has a gap: ${prev.name} is followed by ${cur.name}, so frame${from === to ? ` ${from} is` : `s ${from}–${to} are`} missing. Export the whole run without gaps.`,
        { file: cur.name, after: prev.name, missingFrom: from, missingTo: to },
      );
    }
  }
  return { type, frames: frames.map(({ name, number }) => ({ name, number })), skipped };
}
