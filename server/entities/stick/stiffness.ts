// A stick's stiffness in force on a day — the rule of shared/mechanics/stiffness-in-force.ts in
// its SQL form, so a shot's own query reads the bench test in force on the shot's date
// (server/entities/shot/date.ts) in the same round trip. tests/api/stiffness-in-force.test.ts runs
// one table of days against both forms.
import { getTableName, sql, type Column, type SQL } from "drizzle-orm";
import { benchTest } from "../../db/schema";
import { stiffnessInForce, type BenchTestStiffness, type StiffnessInForce } from "../../../shared/mechanics/stiffness-in-force";
import { DEFAULT_BENCH_SPAN_MM } from "../../../shared/schemas/shot-document";
import type { ShotStickInfo } from "../../../shared/schemas/shots";

export { stiffnessInForce, type StiffnessInForce };

/**
 * The bench test in force on `onDate` (a date or `YYYY-MM-DD` text expression) for the stick in
 * `stickId` (a column of the outer query): the latest tested on or before that day, the latest
 * entered on a tie; null when none. One JSON value, as a subquery.
 */
export function benchTestInForce(stickId: Column, onDate: SQL): SQL<BenchTestStiffness | null> {
  // Qualified by hand: Drizzle leaves a single-table select's columns bare, and a bare "id" here
  // would be the bench test's own.
  const outer = sql`${sql.identifier(getTableName(stickId.table))}.${sql.identifier(stickId.name)}`;
  return sql<BenchTestStiffness | null>`(select json_build_object('testedOn', bt.tested_on, 'measuredFlex', bt.measured_flex, 'eiNm2', bt.ei_nm2) from ${benchTest} bt where bt.stick_id = ${outer} and bt.tested_on <= (${onDate})::date order by bt.tested_on desc, bt.created_at desc limit 1)`;
}

/** The stiffness from a stick's rating and the test in force that a query read. */
export function stiffnessFrom(ratedFlex: number | null, testInForce: BenchTestStiffness | null): StiffnessInForce | null {
  return testInForce ? stiffnessInForce({ ratedFlex, tests: [testInForce] }, testInForce.testedOn) : stiffnessInForce({ ratedFlex, tests: [] }, "");
}

/** What a shot's pages and its recomputation say about the stick (shared/schemas/shots.ts). */
export function shotStickInfo(s: { id: string; label: string; ratedFlex: number | null; testInForce: BenchTestStiffness | null }): ShotStickInfo {
  const k = stiffnessFrom(s.ratedFlex, s.testInForce);
  return {
    id: s.id, label: s.label, flex: k?.flex ?? null, flexSource: k ? (k.source === "bench" ? "measured" : "rated") : null,
    benchSpanMm: DEFAULT_BENCH_SPAN_MM, testedOn: k?.testedOn ?? null,
  };
}
