// Database rows → the API's shapes (shared/schemas/sticks.ts). The stored fit is the engine's
// output at the time of the test; the rating may have changed since, so % of rated is taken
// against the stick's current rating whenever a test is shown.
import type { BenchFit, BenchReading } from "../../shared/mechanics/sticklab";
import type { BenchEntry, BenchTestRow, LatestBenchTest, StickRow } from "../../shared/schemas/sticks";
import type { BenchTestRecord, StickRecord } from "../entities/stick/repository";

/** The jsonb `fit` column: the engine's fit plus how the readings were entered. */
export interface StoredFit extends BenchFit {
  entry: BenchEntry;
}

const percentOf = (measured: number, rated: number | null) => (rated ? (100 * measured) / rated : null);

export function presentBenchTest(test: BenchTestRecord, ratedFlex: number | null, createdByName: string | null): BenchTestRow {
  const { entry, ...fit } = test.fit as StoredFit;
  return {
    id: test.id,
    stickId: test.stickId,
    testedOn: test.testedOn,
    spanMm: test.spanMm,
    loadPointMm: test.loadPointMm,
    readings: test.readings as BenchReading[],
    fit: { ...fit, ratedFlex, percentOfRated: percentOf(fit.measuredFlex, ratedFlex) },
    entry,
    createdBy: test.createdBy && createdByName ? { id: test.createdBy, name: createdByName } : null,
    createdAt: test.createdAt.toISOString(),
  };
}

/** The newest test by date (then by entry time): `tests` come oldest first. */
export function latestOf(tests: readonly BenchTestRecord[], ratedFlex: number | null): LatestBenchTest | null {
  const t = tests.at(-1);
  if (!t) return null;
  return { benchTestId: t.id, testedOn: t.testedOn, measuredFlex: t.measuredFlex, percentOfRated: percentOf(t.measuredFlex, ratedFlex), eiNm2: t.eiNm2 };
}

export function presentStick(
  s: StickRecord,
  ownerName: string | null,
  tests: readonly BenchTestRecord[],
  shotCount: number,
  flexAlertPercent: number,
): StickRow {
  const latest = latestOf(tests, s.ratedFlex);
  return {
    id: s.id,
    label: s.label,
    owner: s.ownerId && ownerName ? { id: s.ownerId, name: ownerName } : null,
    ratedFlex: s.ratedFlex,
    lengthMm: s.lengthMm,
    bladeCurve: s.bladeCurve,
    lie: s.lie,
    firstUseDate: s.firstUseDate,
    notes: s.notes,
    createdAt: s.createdAt.toISOString(),
    latest,
    benchTestCount: tests.length,
    shotCount,
    belowAlert: latest?.percentOfRated != null && latest.percentOfRated < flexAlertPercent,
  };
}
