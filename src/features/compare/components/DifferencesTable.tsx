import { Card, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { convert, digitsOf, formatWithU, metricDef, unitOf } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";
import type { Difference, Side } from "../lib/differences";

const signed = (v: number, d: number) => `${v > 0 ? "+" : v < 0 ? "−" : "±"}${Math.abs(v).toFixed(d)}`;

/** Every result of both shots, the difference B − A, and what it means in words. */
export function DifferencesTable({ diffs, names, colors, units }: { diffs: Difference[]; names: Record<Side, string>; colors: Record<Side, string>; units: UnitSystem }) {
  return (
    <Card title="Differences" description="Values ± one standard uncertainty. A difference counts when it is more than twice the combined uncertainty." flush>
      <Table caption="Differences between the two shots">
        <THead>
          <Tr>
            <Th>Result</Th>
            <Th className="text-right" style={{ color: colors.a }}>{names.a}</Th>
            <Th className="text-right" style={{ color: colors.b }}>{names.b}</Th>
            <Th className="text-right">B − A</Th>
            <Th>What it means</Th>
          </Tr>
        </THead>
        <TBody>
          {diffs.map((d) => {
            const m = metricDef(d.key);
            const unit = unitOf(m.kind, units);
            return (
              <Tr key={d.key} data-testid={`diff-${d.key}`}>
                <Th scope="row" className="font-medium text-ink normal-case">{d.label}</Th>
                <Td label={names.a} className="text-right tabular-nums">{d.a ? formatWithU(m.kind, d.a.value, d.a.u, units) : "—"}</Td>
                <Td label={names.b} className="text-right tabular-nums">{d.b ? formatWithU(m.kind, d.b.value, d.b.u, units) : "—"}</Td>
                <Td label="B − A" className="text-right font-medium tabular-nums">
                  {d.diff === null ? "—" : `${signed(convert(m.kind, d.diff, units), digitsOf(m.kind, units))}${unit === "°" ? "°" : ` ${unit}`}`}
                </Td>
                <Td label="What it means" className="max-md:basis-full">
                  <span className="flex items-center gap-2">
                    {d.winner && <span aria-hidden className="size-2.5 shrink-0 rounded-full" style={{ background: colors[d.winner] }} />}
                    <span className={d.clear ? "font-medium text-ink" : "text-ink-muted"}>{d.sentence}</span>
                  </span>
                </Td>
              </Tr>
            );
          })}
        </TBody>
      </Table>
    </Card>
  );
}
