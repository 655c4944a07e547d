// A stick's measured flex over its bench tests, against its rating and the team's alert mark
// (used sticks measure softer than printed [CP]).
import { StickLabInputError } from "./sticklab-error";

export interface FlexHistoryEntry {
  /** Day of the bench test, YYYY-MM-DD. */
  date: string;
  measuredFlex: number;
  /** Shots logged with the stick up to this test, when known. */
  shotsTaken?: number;
}

export interface FlexHistoryPoint extends FlexHistoryEntry {
  percentOfRated: number | null;
  belowAlert: boolean;
}

export interface FlexHistory {
  points: FlexHistoryPoint[];
  /** A sentence for the page when the latest test is below the alert mark; otherwise null. */
  notice: string | null;
}

/** Points in date order. `alertPercent` is the team's mark, e.g. 85 (% of rated). */
export function flexHistory(entries: readonly FlexHistoryEntry[], ratedFlex: number | null, alertPercent: number): FlexHistory {
  if (ratedFlex !== null && !(Number.isFinite(ratedFlex) && ratedFlex > 0))
    throw new StickLabInputError(`the rated flex must be a number greater than zero (got ${ratedFlex})`, { field: "ratedFlex" });
  if (!(Number.isFinite(alertPercent) && alertPercent > 0 && alertPercent <= 100))
    throw new StickLabInputError(`the alert mark must be a percentage above 0 and at most 100 (got ${alertPercent})`, { field: "alertPercent" });
  const points = [...entries]
    .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0))
    .map((e) => {
      const percentOfRated = ratedFlex === null ? null : (100 * e.measuredFlex) / ratedFlex;
      return { ...e, percentOfRated, belowAlert: percentOfRated !== null && percentOfRated < alertPercent };
    });
  const last = points.at(-1);
  const notice =
    last && last.belowAlert
      ? `Measured ${last.measuredFlex.toFixed(1)} flex on ${last.date}: ${last.percentOfRated!.toFixed(1)} % of its ${ratedFlex} rating, below the team's ${alertPercent} % mark.`
      : null;
  return { points, notice };
}
