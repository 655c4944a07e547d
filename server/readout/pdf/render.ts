import sharp from "sharp";
import { storage } from "../../clips/deps";
import { clipKeys } from "../../storage";
import { log } from "../../log";
import type { ShotEventKey } from "../../../shared/schemas/shots";
import type { ShotReadout } from "../../../shared/schemas/readout";
import { offLoop } from "../../cpu/pool";
import { HttpError } from "../../http/problem";
import type { ReportInput } from "./report";

async function readAll(body: NodeJS.ReadableStream): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body) chunks.push(Buffer.isBuffer(c) ? c : Buffer.from(c as string));
  return Buffer.concat(chunks);
}

/** Small JPEGs of the event frames that are stored; a missing frame just leaves its slot empty. */
export async function eventThumbs(r: ShotReadout): Promise<Partial<Record<ShotEventKey, Buffer>>> {
  const out: Partial<Record<ShotEventKey, Buffer>> = {};
  const ext = r.clip.frameFormat === "webp" ? "webp" : "jpg";
  await Promise.all(
    r.events.map(async (e) => {
      try {
        const key = clipKeys.frame(r.clip.id, e.frame, ext);
        if (!(await storage().exists(key))) return;
        const got = await storage().get(key);
        out[e.key] = await sharp(await readAll(got.body)).resize({ width: 320, withoutEnlargement: true }).jpeg({ quality: 78 }).toBuffer();
      } catch (err) {
        log.warn({ err, clipId: r.clip.id, frame: e.frame }, "report: could not read an event frame");
      }
    }),
  );
  return out;
}

/** Reports being made by this process at most; more answer 503 at once instead of queueing. */
export const MAX_REPORTS_AT_ONCE = 16;
let rendering = 0;

/** The report's PDF, laid out in a worker thread so requests keep being answered meanwhile. */
export async function renderShotReport(input: ReportInput): Promise<Buffer> {
  if (rendering >= MAX_REPORTS_AT_ONCE)
    throw new HttpError(503, "busy", "The server is making many reports right now. Try again in a few seconds.");
  rendering++;
  try {
    const pdf = await offLoop("shotReportPdf", input);
    return Buffer.from(pdf.buffer, pdf.byteOffset, pdf.byteLength);
  } finally {
    rendering--;
  }
}
