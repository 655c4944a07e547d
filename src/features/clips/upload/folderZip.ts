import { Zip, ZipPassThrough } from "fflate";

// A folder of numbered frames picked in the browser goes up as one ZIP through the same resumable
// upload as a video (decision 134). The frames are stored, not compressed again (PNG, TIFF and
// JPEG already are), so this costs no CPU; the server checks the ZIP like any other.

const FRAME_EXTENSION = /\.(png|tiff?|jpe?g)$/i;

/** The frames among a picked folder's files (a camera's settings file and the like stay behind). */
export const frameFiles = (files: readonly File[]) => files.filter((f) => FRAME_EXTENSION.test(f.name) && !f.name.startsWith("."));

/** A ZIP name is the sign of a sequence: the capture rate must be typed for it. */
export const isSequenceFile = (file: File) => /\.zip$/i.test(file.name);

/** The folder's name from a file picked with webkitdirectory ("run12/run12_0001.tif" → "run12"). */
export const folderName = (files: readonly File[]) => (files[0]?.webkitRelativePath.split("/")[0] || "frames").replace(/[^\w .-]+/g, "_");

/**
 * One ZIP (a File, so a reload can resume it: same frames, same bytes) of the frames, under their
 * paths in the folder. Frames are read one at a time; the Blob keeps the parts.
 */
export async function zipFrames(frames: readonly File[], name: string, onProgress?: (done: number) => void): Promise<File> {
  const parts: Uint8Array[] = [];
  let failed: Error | null = null;
  const zip = new Zip((err, chunk) => {
    if (err) failed = err;
    else parts.push(chunk);
  });
  let done = 0;
  for (const f of frames) {
    const entry = new ZipPassThrough(f.webkitRelativePath || f.name);
    entry.mtime = f.lastModified;
    zip.add(entry);
    entry.push(new Uint8Array(await f.arrayBuffer()), true);
    onProgress?.(++done);
    if (failed) throw failed;
  }
  zip.end();
  if (failed) throw failed;
  const lastModified = Math.max(0, ...frames.map((f) => f.lastModified));
  return new File(parts as BlobPart[], `${name}.zip`, { type: "application/zip", lastModified });
}
