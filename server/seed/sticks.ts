// The demo club's sticks and bench tests. Every number here is invented for the demo: a senior
// 85-flex gamer that softens over the season to ~71 flex (84 % of its rating), a new 75 and a
// youth 50. Readings go through the same service (and so the same engine fit) as typed-in ones.
import { NPM_PER_LBF_PER_IN } from "../../shared/units";
import type { Actor } from "../auth/policy";
import { addBenchTest } from "../sticks/bench-service";
import * as repo from "../entities/stick/repository";
import { createStick } from "../sticks/service";
import type { DemoIds } from "./demo-people";

/** Labels of the demo sticks, so other demo steps (e.g. shots) can find them by label. */
export const DEMO_STICK_LABELS = {
  usedSenior: "Theo's gamer — 85 flex",
  newSenior: "Jonah's new 75",
  youth: "Elin's youth 50",
} as const;

interface DemoTest {
  date: string;
  /** The flex the invented readings are made to show. */
  flex: number;
}

interface DemoStick {
  label: string;
  ownerEmail: string;
  ratedFlex: number;
  lengthMm: number;
  bladeCurve: string;
  lie: string;
  firstUseDate: string;
  notes: string;
  units: "imperial" | "metric";
  /** Hung weights, lbf (imperial) or N (metric). */
  loads: number[];
  tests: DemoTest[];
}

const demoSticks: DemoStick[] = [
  {
    label: DEMO_STICK_LABELS.usedSenior,
    ownerEmail: "player@ravens.example",
    ratedFlex: 85,
    lengthMm: 1575,
    bladeCurve: "mid-heel, open face",
    lie: "5.5",
    firstUseDate: "2026-08-15",
    notes: "Game stick since pre-season. Re-tested about every three weeks.",
    units: "imperial",
    loads: [20, 40, 60, 80],
    tests: [
      { date: "2026-08-22", flex: 84.6 },
      { date: "2026-09-12", flex: 82.3 },
      { date: "2026-10-03", flex: 79.5 },
      { date: "2026-10-24", flex: 76.8 },
      { date: "2026-11-14", flex: 73.6 },
      { date: "2026-11-28", flex: 71.4 },
    ],
  },
  {
    label: DEMO_STICK_LABELS.newSenior,
    ownerEmail: "player2@ravens.example",
    ratedFlex: 75,
    lengthMm: 1550,
    bladeCurve: "mid, closed face",
    lie: "5",
    firstUseDate: "2026-11-20",
    notes: "New this month; baseline test before first use.",
    units: "metric",
    loads: [50, 100, 150, 200],
    tests: [{ date: "2026-11-19", flex: 74.6 }],
  },
  {
    label: DEMO_STICK_LABELS.youth,
    ownerEmail: "player3@ravens.example",
    ratedFlex: 50,
    lengthMm: 1400,
    bladeCurve: "mid",
    lie: "5",
    firstUseDate: "2026-09-05",
    notes: "Cut down 5 cm from stock length before the first test.",
    units: "imperial",
    loads: [10, 20, 30, 40],
    tests: [
      { date: "2026-09-05", flex: 49.4 },
      { date: "2026-11-07", flex: 47.9 },
    ],
  },
];

// A dial gauge's reading scatter, in its last digit: small enough that R² stays above 0.999.
const SCATTER = [0.6, -0.4, 0.2, -0.5, 0.3];

function readingsFor(s: Pick<DemoStick, "units" | "loads">, t: DemoTest, k: number) {
  const stiffness = s.units === "imperial" ? t.flex : (t.flex * NPM_PER_LBF_PER_IN) / 1000; // lbf/in or N/mm
  const step = s.units === "imperial" ? 0.005 : 0.1; // in or mm
  const digits = s.units === "imperial" ? 3 : 1;
  return s.loads.map((load, i) => ({
    load,
    deflection: Number((load / stiffness + SCATTER[(i + k) % SCATTER.length] * step).toFixed(digits)),
  }));
}

/** Sticks of a team with their bench tests, entered by its analyst through the bench service; a stick already there (by label) is left alone. */
export async function ensureDemoSticks(analyst: Actor, sticks: (Omit<DemoStick, "lie" | "ownerEmail"> & { lie?: string; ownerId: string | null })[]) {
  for (const s of sticks) {
    if (await repo.stickByLabel(analyst.teamId, s.label)) continue;
    const stick = await createStick(analyst, {
      label: s.label,
      ownerId: s.ownerId,
      ratedFlex: s.ratedFlex,
      lengthMm: s.lengthMm,
      bladeCurve: s.bladeCurve,
      lie: s.lie ?? "5",
      firstUseDate: s.firstUseDate,
      notes: s.notes,
    });
    for (const [k, t] of s.tests.entries())
      await addBenchTest(analyst, stick.id, {
        date: t.date,
        loadUnit: s.units === "imperial" ? "lbf" : "N",
        deflectionUnit: s.units === "imperial" ? "in" : "mm",
        readings: readingsFor(s, t, k),
      });
  }
}

async function seedSticks(ids: DemoIds) {
  const analyst: Actor = { userId: ids.users["analyst@ravens.example"], teamId: ids.teamId, role: "analyst" };
  await ensureDemoSticks(analyst, demoSticks.map((s) => ({ ...s, ownerId: ids.users[s.ownerEmail] })));
}

/** Demo-data steps for this area, run in order after the people; each must be idempotent. */
export const sticksSeedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [{ name: "sticks and bench tests", run: seedSticks }];
