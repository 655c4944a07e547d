import { Link } from "react-router-dom";
import type { BenchTestRow } from "@shared/schemas/sticks";
import { Badge, Card, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { useUnits } from "@/lib/units";
import { formatDay, formatFlex, formatNumber, formatPercent } from "../lib/format";

/** Every bench test of a stick, newest first, each opening its fit. */
export function BenchTestsTable({ tests, alertPercent, action }: { tests: readonly BenchTestRow[]; alertPercent: number; action?: React.ReactNode }) {
  const { format, system } = useUnits();
  return (
    <Card title="Bench tests" description={tests.length === 0 ? undefined : `${tests.length} test${tests.length === 1 ? "" : "s"}, newest first`} actions={action} flush>
      {tests.length === 0 ? (
        <p className="px-5 py-6 text-sm text-ink-muted">No bench tests yet.</p>
      ) : (
        <Table caption="Bench tests">
          <THead>
            <Tr>
              <Th>Date</Th>
              <Th className="text-right">Measured flex</Th>
              <Th className="text-right">% of rated</Th>
              <Th className="hidden text-right sm:table-cell">R²</Th>
              <Th className="hidden md:table-cell">Span</Th>
              <Th>Checks</Th>
            </Tr>
          </THead>
          <TBody>
            {[...tests].reverse().map((t) => {
              const below = t.fit.percentOfRated !== null && t.fit.percentOfRated < alertPercent;
              return (
                <Tr key={t.id} className="hover:bg-sunken/40">
                  <Td primary>
                    <Link to={`bench-tests/${t.id}`} className="font-medium text-accent-strong hover:underline">
                      {formatDay(t.testedOn)}
                    </Link>
                  </Td>
                  <Td label="Measured flex" className="text-right font-medium tabular-nums">{formatFlex(t.fit.measuredFlex)}</Td>
                  <Td label="% of rated" className={below ? "text-right font-medium text-warn tabular-nums" : "text-right tabular-nums"}>{formatPercent(t.fit.percentOfRated)}</Td>
                  <Td label="R²" className="hidden text-right tabular-nums sm:table-cell">{formatNumber(t.fit.r2, 4)}</Td>
                  <Td className="hidden text-ink-muted md:table-cell">
                    {format("length", t.spanMm, { digits: system === "imperial" ? 1 : 0 })}
                    {t.loadPointMm !== t.spanMm / 2 && <> · off-centre</>}
                  </Td>
                  <Td label="Checks">{t.fit.flags.length === 0 ? <Badge tone="ok">Straight line</Badge> : <Badge tone="warn">{t.fit.flags.length} to check</Badge>}</Td>
                </Tr>
              );
            })}
          </TBody>
        </Table>
      )}
    </Card>
  );
}
