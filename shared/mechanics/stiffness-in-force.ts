// Which stiffness a stick has on a given day — THE rule (docs/decisions/122-stiffness-in-force.md).
// The bench test in force on that day: the latest one tested on or before it (the latest entered
// when two share a day); the printed rating only when no test was made by then. Shafts soften with
// use [CP], so a later test says nothing about an earlier day, and an earlier one is the best
// knowledge of a later day. server/entities/stick/stiffness.ts has the same rule in SQL.
import { eiFromFlex } from "./bench-fit-normalise";

export interface BenchTestStiffness {
  /** Calendar date YYYY-MM-DD. */
  testedOn: string;
  measuredFlex: number;
  eiNm2: number;
}

export interface StiffnessInForce {
  source: "bench" | "rated";
  /** lbf/in at the reference span: the test's measured flex, or the rating. */
  flex: number;
  eiNm2: number;
  /** The bench test's date; null for the rating. */
  testedOn: string | null;
}

/**
 * The stiffness in force on `onDate` (YYYY-MM-DD). `tests` in the order they apply: by test date,
 * then by entry (the last of a day wins). Null when the stick has neither a test by then nor a rating.
 */
export function stiffnessInForce(stick: { ratedFlex: number | null; tests: readonly BenchTestStiffness[] }, onDate: string): StiffnessInForce | null {
  const test = stick.tests.filter((t) => t.testedOn <= onDate).at(-1);
  if (test) return { source: "bench", flex: test.measuredFlex, eiNm2: test.eiNm2, testedOn: test.testedOn };
  if (stick.ratedFlex) return { source: "rated", flex: stick.ratedFlex, eiNm2: eiFromFlex(stick.ratedFlex), testedOn: null };
  return null;
}
