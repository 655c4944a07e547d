// Digitise's live preview and the stored result (readout, PDF, CSV) must show one uncertainty per
// result: the same document through the same computation. [calc] no outside source: the check is
// that two code paths agree to the last bit.
import { describe, expect, it } from "vitest";
import { previewResults } from "../../../src/features/digitise/preview/preview-compute";
import { storedShotResults, syntheticShot } from "../../../shared/mechanics/index";
import { metricDef, metricText } from "../../../shared/schemas/readout";
import { toShotDocument, type ShotDocumentParts } from "../../../shared/schemas/shots";

describe("Digitise preview and stored results", () => {
  const { doc } = syntheticShot({ captureFps: 1000, frames: 300, noisePx: 0.5, seed: "preview" });
  const parts: ShotDocumentParts = {
    captureFps: doc.captureFps,
    calibration: { ...(doc.calibration as { type: "scaleBar"; a: [number, number]; b: [number, number]; lengthMm: number }), lengthUnit: "mm" },
    marks: doc.tracks,
    events: doc.events,
    frameStart: 0,
    frameEnd: 299,
    stick: { flex: 85, benchSpanMm: 1000 },
  };

  it("the preview's document (pixelsOnly) is the server's when the clip is calibrated", () => {
    expect(toShotDocument(parts, { pixelsOnly: true })).toEqual(toShotDocument(parts));
  });

  it("every number and its ± are identical, and read the same in the readout's words", () => {
    const server = storedShotResults(toShotDocument(parts).doc);
    const preview = previewResults(toShotDocument(parts, { pixelsOnly: true }).doc);
    expect(preview).toEqual(server);
    for (const key of ["puckExitSpeed", "bladeSpeedAtStrike", "peakBend", "contactTime", "storedEnergy"] as const)
      expect(metricText(metricDef(key), preview, "metric")?.full).toBe(metricText(metricDef(key), server, "metric")?.full);
  });
});
