import type { MetricKey } from "@shared/schemas/readout";
import type { Difference, Side } from "../lib/differences";

const HEADLINES: { key: MetricKey; question: string }[] = [
  { key: "loadTime", question: "Loaded the stick longer" },
  { key: "contactTime", question: "Released faster" },
  { key: "puckExitSpeed", question: "Puck left faster" },
];

/** The three answers a player looks for first, in big type with the winning shot's colour. */
export function Verdicts({ diffs, names, colors }: { diffs: Difference[]; names: Record<Side, string>; colors: Record<Side, string> }) {
  return (
    <ul className="grid gap-4 md:grid-cols-3" aria-label="At a glance">
      {HEADLINES.map(({ key, question }) => {
        const d = diffs.find((x) => x.key === key)!;
        const w = d.winner;
        return (
          <li
            key={key}
            data-testid={`verdict-${key}`}
            data-winner={w ?? "none"}
            className="rounded-[var(--radius-card)] border-2 bg-surface p-5 shadow-[var(--shadow-card)]"
            style={{ borderColor: w ? colors[w] : "var(--color-line)" }}
          >
            <p className="text-sm font-medium tracking-wide text-ink-muted uppercase">{question}</p>
            <p className="mt-1 text-3xl font-semibold" style={{ color: w ? colors[w] : undefined }}>
              {w ? names[w] : d.diff === null ? "—" : "Even"}
            </p>
            <p className="mt-1 text-[0.95rem] text-ink">{d.sentence}</p>
          </li>
        );
      })}
    </ul>
  );
}
