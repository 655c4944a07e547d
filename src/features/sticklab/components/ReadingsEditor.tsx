import { Button, Input } from "@/components/ui";
import { benchUnits, type BenchUnits } from "../lib/bench-units";

export interface ReadingRow {
  key: number;
  load: string;
  deflection: string;
}

let nextKey = 1;
export const blankRows = (n: number): ReadingRow[] => Array.from({ length: n }, () => ({ key: nextKey++, load: "", deflection: "" }));

interface Props {
  rows: ReadingRow[];
  onChange: (rows: ReadingRow[]) => void;
  units: BenchUnits;
  /** Row (0-based) the current problem is about, to outline it. */
  problemRow?: number;
}

/** Hung load and the gauge's deflection under it, one reading per row. */
export function ReadingsEditor({ rows, onChange, units, problemRow }: Props) {
  const u = benchUnits[units];
  const set = (i: number, patch: Partial<ReadingRow>) => onChange(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  return (
    <div className="flex flex-col gap-2">
      <div className="grid grid-cols-[2rem_1fr_1fr_2.5rem] gap-2 px-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">
        <span>#</span>
        <span>Load ({u.load})</span>
        <span>Deflection ({u.deflection})</span>
        <span className="sr-only">Remove</span>
      </div>
      {rows.map((r, i) => (
        <div key={r.key} className="grid grid-cols-[2rem_1fr_1fr_2.5rem] items-center gap-2">
          <span className="text-right text-sm text-ink-muted tabular-nums">{i + 1}</span>
          <Input
            aria-label={`Load ${i + 1} (${u.load})`}
            inputMode="decimal"
            value={r.load}
            aria-invalid={problemRow === i || undefined}
            onChange={(e) => set(i, { load: e.target.value })}
          />
          <Input
            aria-label={`Deflection ${i + 1} (${u.deflection})`}
            inputMode="decimal"
            value={r.deflection}
            aria-invalid={problemRow === i || undefined}
            onChange={(e) => set(i, { deflection: e.target.value })}
          />
          <Button variant="ghost" size="sm" aria-label={`Remove reading ${i + 1}`} disabled={rows.length <= 1} onClick={() => onChange(rows.filter((_, j) => j !== i))}>
            ✕
          </Button>
        </div>
      ))}
      <Button variant="secondary" size="sm" className="mt-1 self-start" onClick={() => onChange([...rows, ...blankRows(1)])}>
        Add reading
      </Button>
    </div>
  );
}
