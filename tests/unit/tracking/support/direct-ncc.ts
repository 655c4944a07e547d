// TM_CCOEFF_NORMED straight from its definition (OpenCV's matchTemplate documentation):
// R(x, y) = Σ T'(x', y')·I'(x + x', y + y') / sqrt(Σ T'² · Σ I'²), with T' and I' the template and
// the image patch under it, each less its own mean. Used to check the OpenCV wiring and, in the
// benchmark, as the plain-JavaScript alternative to OpenCV.
import type { Rect, ScoreMap } from "../../../../shared/tracking/matcher";
import type { GrayFrame } from "../../../../shared/tracking/types";

export function directNcc(frame: GrayFrame, window: Rect, template: GrayFrame): ScoreMap {
  const { width: tw, height: th, data: t } = template;
  const n = tw * th;
  let tSum = 0;
  for (let i = 0; i < n; i++) tSum += t[i];
  const tMean = tSum / n;
  const tz = new Float64Array(n);
  let tSq = 0;
  for (let i = 0; i < n; i++) {
    tz[i] = t[i] - tMean;
    tSq += tz[i] * tz[i];
  }
  const width = window.width - tw + 1;
  const height = window.height - th + 1;
  const data = new Float32Array(width * height);
  const f = frame.data;
  for (let v = 0; v < height; v++)
    for (let u = 0; u < width; u++) {
      let sum = 0, sq = 0, cross = 0;
      for (let j = 0; j < th; j++) {
        let at = (window.y + v + j) * frame.width + window.x + u;
        const row = j * tw;
        for (let i = 0; i < tw; i++, at++) {
          const p = f[at];
          sum += p;
          sq += p * p;
          cross += p * tz[row + i];
        }
      }
      const iVar = sq - (sum * sum) / n;
      data[v * width + u] = iVar > 0 && tSq > 0 ? cross / Math.sqrt(tSq * iVar) : 0;
    }
  return { width, height, data };
}
