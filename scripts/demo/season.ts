// The demo season of the made-up Lakeport Ravens and their U16 side, September to November 2026:
// sessions, players, sticks with bench tests, and clips of synthetic shots (shot-scene.ts). Every
// person, number and date here is invented for the demo only; nothing comes from a real club,
// player or clip. The plan is pure and deterministic (seeded random numbers), so the seed
// (server/seed/season.ts), its renders' cache keys and the counts test (tests/api/demo-season.test.ts)
// always see the same season.
import seedrandom from "seedrandom";
import type { ShotType } from "../../shared/schemas/clips";
import type { SceneOptions } from "./shot-scene";

export type SeasonTeam = "senior" | "u16";

export interface SeasonPlayer { email: string; name: string; teams: SeasonTeam[]; gloves: string; /** Share of the team's typical speeds. */ skill: number }

/** Players added by the season; the base demo's Theo, Jonah and Elin take part too. */
export const seasonPlayers: SeasonPlayer[] = [
  { email: "callum@ravens.example", name: "Callum Fairbrother", teams: ["senior"], gloves: "#c47a1c", skill: 1.06 },
  { email: "oskar@ravens.example", name: "Oskar Lindgren-Moss", teams: ["senior"], gloves: "#3c7d4a", skill: 0.97 },
  { email: "rafael@ravens.example", name: "Rafael Quennell", teams: ["senior"], gloves: "#8c2f6e", skill: 1.01 },
  { email: "noah@ravens.example", name: "Noah Brightwater", teams: ["senior"], gloves: "#2f4f8c", skill: 0.93 },
  { email: "isla@ravens.example", name: "Isla Thorvaldsen", teams: ["u16"], gloves: "#b03a48", skill: 1.04 },
  { email: "mika@ravens.example", name: "Mika Okonkwo-Hale", teams: ["u16"], gloves: "#3f8f8a", skill: 0.98 },
  { email: "ben@ravens.example", name: "Ben Achterberg", teams: ["u16"], gloves: "#7a6a2a", skill: 0.94 },
  { email: "yuki@ravens.example", name: "Yuki Lachance", teams: ["u16"], gloves: "#5a4fb3", skill: 1.0 },
  { email: "adrien@ravens.example", name: "Adrien Kowalczyk", teams: ["u16"], gloves: "#a0522d", skill: 0.91 },
  { email: "sofia@ravens.example", name: "Sofia Delacroix-Byrne", teams: ["u16"], gloves: "#2a7fb0", skill: 0.96 },
];

/** Base-demo people who join the U16 side in the season: the analyst works for both, Theo plays up and down. */
export const seasonExtraMemberships: { email: string; team: SeasonTeam; role: "analyst" | "player" }[] = [
  { email: "analyst@ravens.example", team: "u16", role: "analyst" },
  { email: "player@ravens.example", team: "u16", role: "player" },
];

/** The base demo's players (server/seed/demo-people.ts), by e-mail: first name, gloves and skill in the season. */
const basePlayers: Record<string, { name: string; gloves: string; skill: number; teams: SeasonTeam[] }> = {
  "player@ravens.example": { name: "Theo", gloves: "#2a8fb0", skill: 1.0, teams: ["senior", "u16"] },
  "player2@ravens.example": { name: "Jonah", gloves: "#b8452f", skill: 1.03, teams: ["senior"] },
  "player3@ravens.example": { name: "Elin", gloves: "#6b4fb3", skill: 0.9, teams: ["senior", "u16"] },
};

export interface SeasonStick {
  team: SeasonTeam;
  label: string;
  ownerEmail: string | null;
  ratedFlex: number;
  lengthMm: number;
  bladeCurve: string;
  firstUseDate: string;
  notes: string;
  units: "imperial" | "metric";
  loads: number[];
  tests: { date: string; flex: number }[];
}

export const seasonSticks: SeasonStick[] = [
  { team: "senior", label: "Callum's 87 — pro stock", ownerEmail: "callum@ravens.example", ratedFlex: 87, lengthMm: 1590, bladeCurve: "heel, open face", firstUseDate: "2026-09-01", notes: "Pro-stock shaft; the team re-tests it monthly.", units: "imperial", loads: [20, 40, 60, 80], tests: [{ date: "2026-09-08", flex: 88.1 }, { date: "2026-10-06", flex: 86.9 }, { date: "2026-11-03", flex: 85.7 }] },
  { team: "senior", label: "Oskar's 75", ownerEmail: "oskar@ravens.example", ratedFlex: 75, lengthMm: 1550, bladeCurve: "mid, open face", firstUseDate: "2026-09-10", notes: "", units: "metric", loads: [50, 100, 150, 200], tests: [{ date: "2026-09-10", flex: 74.8 }, { date: "2026-11-05", flex: 72.9 }] },
  { team: "senior", label: "Team spare — 80 flex", ownerEmail: null, ratedFlex: 80, lengthMm: 1570, bladeCurve: "mid", firstUseDate: "2026-08-30", notes: "Kept in the bench bag for broken sticks.", units: "imperial", loads: [20, 40, 60, 80], tests: [{ date: "2026-09-01", flex: 79.4 }, { date: "2026-11-17", flex: 78.8 }] },
  { team: "u16", label: "Isla's 60", ownerEmail: "isla@ravens.example", ratedFlex: 60, lengthMm: 1480, bladeCurve: "mid, closed face", firstUseDate: "2026-09-12", notes: "", units: "imperial", loads: [10, 20, 30, 40], tests: [{ date: "2026-09-12", flex: 59.6 }, { date: "2026-10-17", flex: 58.4 }, { date: "2026-11-21", flex: 57.1 }] },
  { team: "u16", label: "Mika's 55", ownerEmail: "mika@ravens.example", ratedFlex: 55, lengthMm: 1460, bladeCurve: "mid", firstUseDate: "2026-09-12", notes: "Cut down 3 cm.", units: "metric", loads: [40, 80, 120, 160], tests: [{ date: "2026-09-12", flex: 56.2 }, { date: "2026-11-21", flex: 54.9 }] },
  { team: "u16", label: "U16 spare — 50 flex", ownerEmail: null, ratedFlex: 50, lengthMm: 1420, bladeCurve: "mid", firstUseDate: "2026-09-05", notes: "", units: "imperial", loads: [10, 20, 30, 40], tests: [{ date: "2026-09-05", flex: 50.3 }, { date: "2026-10-31", flex: 49.6 }] },
];

export interface SeasonSession { team: SeasonTeam; date: string; venue: string; drill: string; /** Local time (America/Vancouver) the first clip was filmed, HH:MM. */ start: string; shotTypes: ShotType[]; captureFps: number; camera: string }

const ARENA = "Lakeport Arena, rink 2";
const LAB = "Lakeport Arena, shooting lab";
const HARBOUR = "Harbourview Community Rink";
export const seasonSessions: SeasonSession[] = [
  { team: "senior", date: "2026-09-15", venue: ARENA, drill: "Pre-season: slap and wrist shots", start: "18:40", shotTypes: ["slap", "wrist"], captureFps: 240, camera: "Coach's phone" },
  { team: "u16", date: "2026-09-19", venue: HARBOUR, drill: "Skills camp: wrist shots", start: "10:15", shotTypes: ["wrist"], captureFps: 240, camera: "U16 phone" },
  { team: "senior", date: "2026-09-29", venue: ARENA, drill: "Snap shots off the pass", start: "18:35", shotTypes: ["snap"], captureFps: 240, camera: "Coach's phone" },
  { team: "senior", date: "2026-10-14", venue: LAB, drill: "Testing day, lane 1", start: "17:50", shotTypes: ["slap"], captureFps: 1000, camera: "Ravens lab cam A" },
  { team: "u16", date: "2026-10-17", venue: HARBOUR, drill: "Snap shots and backhands", start: "10:05", shotTypes: ["snap", "backhand"], captureFps: 240, camera: "U16 phone" },
  { team: "senior", date: "2026-10-27", venue: ARENA, drill: "Backhands and wrist shots in tight", start: "18:45", shotTypes: ["backhand", "wrist"], captureFps: 240, camera: "Coach's phone" },
  { team: "u16", date: "2026-11-07", venue: HARBOUR, drill: "Slap shot basics", start: "10:20", shotTypes: ["slap"], captureFps: 480, camera: "U16 phone" },
  { team: "senior", date: "2026-11-10", venue: ARENA, drill: "Slap shots from the point", start: "18:30", shotTypes: ["slap", "snap"], captureFps: 240, camera: "Coach's phone" },
  { team: "senior", date: "2026-11-24", venue: ARENA, drill: "Game week: mixed shooting", start: "18:50", shotTypes: ["wrist", "snap", "backhand"], captureFps: 240, camera: "Coach's phone" },
  { team: "u16", date: "2026-11-28", venue: HARBOUR, drill: "Wrist and snap shots, review", start: "10:10", shotTypes: ["wrist", "snap"], captureFps: 240, camera: "U16 phone" },
];

/** Typical senior speeds and shaft loading per shot type (invented; m/s, mm, ms). */
const typical: Record<ShotType, { exit: number; blade: number; deflection: number; loadMs: number; contactMs: number }> = {
  slap: { exit: 31, blade: 21, deflection: 42, loadMs: 22, contactMs: 27 },
  snap: { exit: 26, blade: 18, deflection: 30, loadMs: 16, contactMs: 22 },
  wrist: { exit: 23, blade: 15.5, deflection: 24, loadMs: 30, contactMs: 38 },
  backhand: { exit: 18, blade: 12.5, deflection: 14, loadMs: 24, contactMs: 34 },
};

/** A clip's state other than ready with every shot digitised and published. */
export type SeasonClipState = "rateUnconfirmed" | "extracting" | "failed" | "notDigitised" | "inReview";

export interface SeasonShot { label: string; scene: SceneOptions }
export interface SeasonClip {
  title: string;
  team: SeasonTeam;
  session: SeasonSession;
  playerEmail: string;
  shotType: ShotType;
  captureFps: number;
  /** A stick label: the season's, or the base demo's (server/seed/sticks.ts). */
  stickLabel: string | null;
  /** Minutes after the session's start that the clip was filmed. */
  minute: number;
  state: SeasonClipState | "done";
  shots: SeasonShot[];
}

/** Which stick each player shoots with (base demo sticks by their labels). */
const stickOf: Record<string, string> = {
  "player@ravens.example": "Theo's gamer — 85 flex",
  "player2@ravens.example": "Jonah's new 75",
  "player3@ravens.example": "Elin's youth 50",
  "callum@ravens.example": "Callum's 87 — pro stock",
  "oskar@ravens.example": "Oskar's 75",
  "rafael@ravens.example": "Team spare — 80 flex",
  "isla@ravens.example": "Isla's 60",
  "mika@ravens.example": "Mika's 55",
  "ben@ravens.example": "U16 spare — 50 flex",
};

const typeWords: Record<ShotType, string> = { slap: "Slap shots", snap: "Snap shots", wrist: "Wrist shots", backhand: "Backhands" };
const typeWord: Record<ShotType, string> = { slap: "Slap shot", snap: "Snap shot", wrist: "Wrist shot", backhand: "Backhand" };

/** A phone's slow-motion picture size (smaller than its normal video, as phones do), and the scale at 4 m. */
export const SEASON_FRAME = { width: 800, height: 450, mmPerPx: 4 } as const;

/** Frames a shot needs at a rate: a little before ice strike, load, contact, 40 ms of flight. */
function sceneFor(type: ShotType, fps: number, team: SeasonTeam, skill: number, progress: number, rnd: () => number, camera: string, gloves: string): SceneOptions {
  const t = typical[type];
  const level = (team === "u16" ? 0.8 : 1) * skill * (1 + 0.05 * progress);
  const exit = +(t.exit * level * (1 + 0.04 * (rnd() - 0.5))).toFixed(2);
  const blade = +(t.blade * level * (1 + 0.04 * (rnd() - 0.5))).toFixed(2);
  const loadMs = Math.round(t.loadMs * (0.9 + 0.2 * rnd()));
  const contactMs = Math.round(t.contactMs * (0.9 + 0.2 * rnd()));
  const ice = Math.max(3, Math.round(0.012 * fps));
  const frames = ice + Math.round(((loadMs + contactMs + 44) * fps) / 1000) + 2;
  return {
    ...SEASON_FRAME, captureFps: fps, frames, iceStrikeFrame: ice, exitSpeedMps: exit, bladeSpeedMps: blade,
    peakDeflectionMm: Math.round(t.deflection * (team === "u16" ? 0.8 : 1) * (0.92 + 0.16 * rnd())), loadMs, contactMs,
    caption: `${camera} · ${typeWord[type].toLowerCase()}`, gloves,
  };
}

/** Who shoots in each session: the team's players, a few at a time, turn by turn. */
function seasonRoster(team: SeasonTeam) {
  const base = Object.entries(basePlayers).filter(([, p]) => p.teams.includes(team)).map(([email, p]) => ({ email, ...p }));
  return [...base, ...seasonPlayers.filter((p) => p.teams.includes(team))];
}

function buildClips(): SeasonClip[] {
  const rnd = seedrandom.alea("lakeport-season-2026");
  const clips: SeasonClip[] = [];
  const turn: Record<SeasonTeam, number> = { senior: 0, u16: 0 };
  const sessionsOf = (team: SeasonTeam) => seasonSessions.filter((s) => s.team === team);
  for (const s of seasonSessions) {
    const roster = seasonRoster(s.team);
    const progress = sessionsOf(s.team).indexOf(s) / (sessionsOf(s.team).length - 1);
    // Four players a session, each with one clip of three or four shots of one of the drill's shot
    // types (taken in turn); the lab day with fewer, longer shots.
    const shooters = Array.from({ length: 4 }, (_, i) => roster[(turn[s.team] + i) % roster.length]);
    turn[s.team] += 3;
    // Theo shoots at every senior session (the drill's first shot type), so his Progress spans the season.
    const theo = shooters.findIndex((p) => p.email === "player@ravens.example");
    if (s.team === "senior") {
      if (theo > 0) [shooters[0], shooters[theo]] = [shooters[theo], shooters[0]];
      if (theo < 0) shooters[0] = roster.find((p) => p.email === "player@ravens.example")!;
    }
    for (const [i, p] of shooters.entries()) {
      const type = s.shotTypes[i % s.shotTypes.length];
      const n = s.captureFps >= 1000 ? 2 : 3 + (i % 2);
      clips.push({
        title: `${typeWords[type]}, ${s.date.slice(5)} — ${p.name.split(" ")[0]}`,
        team: s.team, session: s, playerEmail: p.email, shotType: type, captureFps: s.captureFps,
        stickLabel: stickOf[p.email] ?? null, minute: 9 * i, state: "done",
        shots: Array.from({ length: n }, (_, k) => ({
          label: `${typeWord[type]} ${k + 1}`,
          scene: sceneFor(type, s.captureFps, s.team, p.skill, progress, rnd, s.camera, p.gloves),
        })),
      });
    }
  }
  // The latest sessions are still being worked through: one clip of each team waits for review
  // (results, not yet published), one for its marks (shots made, nothing digitised).
  const last = (team: SeasonTeam) => clips.filter((c) => c.team === team && c.session === sessionsOf(team).at(-1));
  for (const team of ["senior", "u16"] as const) {
    // Theo's clips stay published: his shares and Progress come from them.
    const [a, b] = last(team).filter((c) => c.playerEmail !== "player@ravens.example");
    a.state = "inReview";
    b.state = "notDigitised";
  }
  return clips;
}

/** Clips in the states a club meets along the way, each with one shot that is not digitised. */
function buildOddClips(): SeasonClip[] {
  const rnd = seedrandom.alea("lakeport-season-2026-odd");
  const seniorLast = seasonSessions.filter((s) => s.team === "senior").at(-1)!;
  const u16Last = seasonSessions.filter((s) => s.team === "u16").at(-1)!;
  const one = (team: SeasonTeam, s: SeasonSession, email: string, type: ShotType, state: SeasonClipState, title: string, minute: number): SeasonClip => ({
    title, team, session: s, playerEmail: email, shotType: type, captureFps: s.captureFps, stickLabel: stickOf[email] ?? null, minute, state,
    shots: [{ label: `${typeWord[type]} 1`, scene: sceneFor(type, s.captureFps, team, 1, 1, rnd, s.camera, "#2a8fb0") }],
  });
  return [
    one("senior", seniorLast, "rafael@ravens.example", "wrist", "rateUnconfirmed", "Wrist shots, 11-24 — Rafael, second phone", 60),
    one("senior", seniorLast, "noah@ravens.example", "snap", "failed", "Snap shots, 11-24 — Noah, second take", 67),
    one("u16", u16Last, "yuki@ravens.example", "wrist", "extracting", "Wrist shots, 11-28 — Yuki", 60),
    one("u16", u16Last, "adrien@ravens.example", "snap", "rateUnconfirmed", "Snap shots, 11-28 — Adrien", 67),
  ];
}

export const seasonClips: SeasonClip[] = [...buildClips(), ...buildOddClips()];

/** Shares of published shots with teammates (late November, so players' homes show them as recent). */
export const seasonShares: { clip: (c: SeasonClip) => boolean; label: string; withEmail: string; at: string }[] = [
  { clip: (c) => c.title === "Wrist shots, 10-27 — Callum", label: "Wrist shot 1", withEmail: "player@ravens.example", at: "2026-11-25T19:30:00-08:00" },
  { clip: (c) => c.title === "Wrist shots, 11-24 — Theo", label: "Wrist shot 2", withEmail: "oskar@ravens.example", at: "2026-11-26T08:15:00-08:00" },
  { clip: (c) => c.title === "Slap shots, 10-14 — Noah", label: "Slap shot 1", withEmail: "player2@ravens.example", at: "2026-11-20T20:05:00-08:00" },
  { clip: (c) => c.title === "Wrist shots, 11-28 — Mika", label: "Wrist shot 1", withEmail: "player@ravens.example", at: "2026-11-29T09:40:00-08:00" },
  { clip: (c) => c.title === "Snap shots, 11-28 — Ben", label: "Snap shot 1", withEmail: "player3@ravens.example", at: "2026-11-29T10:05:00-08:00" },
];

/** The UTC instant of a local time in America/Vancouver on a date (daylight saving time included). */
export function vancouverTime(date: string, hhmm: string, plusMinutes = 0): Date {
  const guess = new Date(`${date}T${hhmm}:00Z`);
  const offset = new Intl.DateTimeFormat("en-US", { timeZone: "America/Vancouver", timeZoneName: "longOffset" }).formatToParts(guess).find((p) => p.type === "timeZoneName")!.value; // "GMT-07:00"
  const m = /GMT([+-])(\d\d):(\d\d)/.exec(offset);
  const minutes = m ? (m[1] === "-" ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
  return new Date(guess.getTime() - minutes * 60_000 + plusMinutes * 60_000);
}
