// The home page's answer to "what needs me now?", by role (GET /api/teams/:teamId/home).
import type { ShotType } from "./clips";

/** One thing waiting for someone, said as a sentence, with links straight to it. */
export interface HomeTask {
  key: "rateUnconfirmed" | "clipsFailed" | "clipsNotDigitised" | "shotsToReview" | "sticksBelowAlert" | "trackingRunning" | "invitationsPending" | "staffSeats";
  /** How many there are; a task with 0 is never sent (staff seats excepted: always shown to a team admin). */
  count: number;
  title: string;
  /** The page that lists them all. */
  href: string;
  /** Up to three of them, oldest or most urgent first, each its own link. */
  examples: { label: string; href: string }[];
}

/** A shot on a player's home: one line, its puck exit speed with ± when it has results. */
export interface HomeShot {
  id: string;
  label: string;
  date: string;
  shotType: ShotType;
  puckExitSpeedMps: number | null;
  puckExitSpeedUMps: number | null;
}

export interface HomeResponse {
  /** Staff and team admin: what waits for them (empty: nothing does). Players: always empty. */
  tasks: HomeTask[];
  /** Players only. */
  player: null | {
    /** Their own published shots, newest first (at most 3 with results). */
    latest: HomeShot[];
    /** Their fastest puck exit speed per shot type; results flagged as implausible left out. */
    bests: HomeShot[];
    /** Shots of teammates shared with them in the last 14 days, newest share first. */
    shared: (HomeShot & { playerName: string | null; sharedAt: string })[];
    /** How many of their own shots they can see (0: a brand-new player). */
    ownShots: number;
  };
}
