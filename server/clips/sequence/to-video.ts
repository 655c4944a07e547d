// An uploaded ZIP of numbered frames → one video file in a job folder, or a refusal naming the
// frame at fault. Nothing is stored here: the caller stores the video like any other upload.
import path from "node:path";
import { checkSequenceFrames, sequenceToVideo, type SequenceFault } from "../../media/sequence";
import type { MediaConfig } from "../../media/ffmpeg";
import { MediaInputError } from "../../media/errors";
import { unpackSequence, type ArchiveLimits } from "./archive";
import { pngSignificantBits } from "./png-bits";
import type { SequenceImageType } from "./names";

/** Kept with the clip (in its probe) so the clip says where its frames came from. */
export interface SequenceFacts {
  type: SequenceImageType;
  frames: number;
  firstName: string;
  lastName: string;
  /** Entries that were not frames, left in the archive (first 20). */
  skipped: string[];
  skippedCount: number;
  /** Bits that carry the picture, from the first frame's sBIT chunk (PNG), else null. */
  significantBits: number | null;
}

function faultError(fault: SequenceFault, name: string): MediaInputError {
  if (fault.kind === "size")
    return new MediaInputError(
      "sequence_mixed_sizes",
      `${name} is ${fault.width} × ${fault.height} pixels, but the frames before it are ${fault.firstWidth} × ${fault.firstHeight}. Every frame of a sequence must have one size. Nothing was stored.`,
      { file: name, width: fault.width, height: fault.height },
    );
  return new MediaInputError(
    "sequence_unreadable_image",
    `${name} cannot be read as an image: it is damaged, not what its name says, or larger than this server accepts. Export it again. Nothing was stored.`,
    { file: name },
  );
}

export async function sequenceZipToVideo(
  media: MediaConfig,
  zip: string,
  dir: string,
  o: ArchiveLimits & { maxPixels: number; signal?: AbortSignal },
): Promise<{ file: string; facts: SequenceFacts }> {
  const seq = await unpackSequence(zip, dir, o);
  const count = seq.frames.length;
  const check = await checkSequenceFrames(media, seq.pattern, count, { maxPixels: o.maxPixels, signal: o.signal });
  if (check.fault) throw faultError(check.fault, seq.frames[check.fault.index].name);
  const significantBits = seq.type === "png" ? await pngSignificantBits(seq.pattern.replace("%08d", "0".repeat(8))) : null;
  const file = path.join(dir, "sequence.mkv");
  await sequenceToVideo(media, seq.pattern, file, { count, signal: o.signal });
  return {
    file,
    facts: {
      type: seq.type,
      frames: count,
      firstName: seq.frames[0].name,
      lastName: seq.frames[count - 1].name,
      skipped: seq.skipped.slice(0, 20),
      skippedCount: seq.skipped.length,
      significantBits,
    },
  };
}
