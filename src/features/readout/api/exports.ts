import { env } from "@/lib/env";
import type { UnitSystem } from "@shared/units";

export type ExportKind = "report.pdf" | "results.csv" | "marks.csv";

/** Download addresses of a shot's exports, in the viewer's units (the server checks access again). */
export const exportUrl = (teamId: string, shotId: string, kind: ExportKind, units: UnitSystem) =>
  `${env.apiBase}/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}/${kind}?units=${units}`;
