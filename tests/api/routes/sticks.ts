import type { Ctx, RouteCase } from "../route-table";

const ALL = ["admin", "coach", "analyst", "player"] as const;
const STAFF = ["admin", "coach", "analyst"] as const;
const PLAYER = "player@ravens.example";

const readings = [20, 40, 60, 80].map((load) => ({ load, deflection: load / 71.4 }));
const benchBody = { date: "2026-11-20", loadUnit: "lbf", deflectionUnit: "in", readings };

/** A stick owned by the demo player, so the player may see it (but not change it). */
async function stickFixture(c: Ctx) {
  const r = await c.admin.post(`/api/teams/${c.teamId}/sticks`, { label: `Policy ${Date.now()}`, ratedFlex: 85, ownerId: c.users[PLAYER] });
  if (r.status !== 201) throw new Error(`stick fixture: ${r.status} ${r.text}`);
  return { stickId: r.json.id as string };
}

async function benchTestFixture(c: Ctx) {
  const { stickId } = await stickFixture(c);
  const r = await c.admin.post(`/api/teams/${c.teamId}/sticks/${stickId}/bench-tests`, benchBody);
  if (r.status !== 201) throw new Error(`bench test fixture: ${r.status} ${r.text}`);
  return { stickId, testId: r.json.id as string };
}

/** A shot of the demo player with a stick and a stored shaft deflection (rows written directly: the shots API is another area's). */
async function shotFixture(c: Ctx) {
  const { stickId } = await benchTestFixture(c);
  const { db } = await import("../../../server/db/client");
  const { clip, shot, shotResult } = await import("../../../server/db/schema");
  const playerId = c.users[PLAYER];
  const [cl] = await db().insert(clip).values({ teamId: c.teamId, captureFps: 3200, playerId, stickId, status: "ready" }).returning();
  const [sh] = await db().insert(shot).values({ teamId: c.teamId, clipId: cl.id, playerId, stickId, label: "Policy shot", publishedAt: new Date() }).returning();
  await db().insert(shotResult).values({
    shotId: sh.id, teamId: c.teamId, engineVersion: "test", shotVersion: 1,
    results: { shaftDeflection: { valueMm: 30, uncertaintyMm: 1, interval95Mm: null, frame: 10, aMm: 400, bMm: 800 } },
  });
  return { shotId: sh.id };
}

function csvBody() {
  const form = new FormData();
  form.set("date", "2026-11-20");
  form.set("file", new Blob(["load_lbf,deflection_in\n20,0.28\n40,0.56\n60,0.84\n80,1.12\n"], { type: "text/csv" }), "r.csv");
  return form;
}

const T = (c: Ctx) => `/api/teams/${c.teamId}`;

/** Rows of the policy table for this area (see tests/api/route-table.ts). */
export const sticksRoutes: RouteCase[] = [
  { name: "list sticks", method: "GET", path: (c) => `${T(c)}/sticks`, allowed: ALL, teamScoped: true },
  { name: "add stick", method: "POST", path: (c) => `${T(c)}/sticks`, body: () => ({ label: "Policy new", ratedFlex: 75 }), allowed: STAFF, teamScoped: true },
  { name: "stick detail", method: "GET", path: (c) => `${T(c)}/sticks/${c.ids.stickId}`, allowed: ALL, teamScoped: true, fixture: stickFixture },
  { name: "edit stick", method: "PATCH", path: (c) => `${T(c)}/sticks/${c.ids.stickId}`, body: () => ({ notes: "edited" }), allowed: STAFF, teamScoped: true, fixture: stickFixture },
  { name: "delete stick", method: "DELETE", path: (c) => `${T(c)}/sticks/${c.ids.stickId}`, allowed: STAFF, teamScoped: true, fixture: stickFixture },
  { name: "bench test (table)", method: "POST", path: (c) => `${T(c)}/sticks/${c.ids.stickId}/bench-tests`, body: () => benchBody, allowed: STAFF, teamScoped: true, fixture: stickFixture },
  { name: "bench test (CSV upload)", method: "POST", path: (c) => `${T(c)}/sticks/${c.ids.stickId}/bench-tests/csv`, body: csvBody, allowed: STAFF, teamScoped: true, fixture: stickFixture },
  { name: "delete bench test", method: "DELETE", path: (c) => `${T(c)}/sticks/${c.ids.stickId}/bench-tests/${c.ids.testId}`, allowed: STAFF, teamScoped: true, fixture: benchTestFixture },
  { name: "flex alert level", method: "PATCH", path: (c) => `${T(c)}/stick-lab/settings`, body: () => ({ flexAlertPercent: 85 }), allowed: ["admin"], teamScoped: true },
  {
    name: "solve beam", method: "POST", path: (c) => `${T(c)}/beam`, allowed: ALL, teamScoped: true,
    body: () => ({ lengthMm: 1500, supportsMm: [100, 1400], loads: [{ xMm: 700, forceN: 250 }], eiNm2: 300 }),
  },
  { name: "beam from a shot", method: "GET", path: (c) => `${T(c)}/beam/shots/${c.ids.shotId}`, allowed: ALL, teamScoped: true, fixture: shotFixture },
];
