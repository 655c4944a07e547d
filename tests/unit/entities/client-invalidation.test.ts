// One invalidation per entity change: every page that shows a shot's numbers is refreshed by the
// entity's own call, whichever feature owns the page. The queries are the features' own options,
// so a feature that puts a query outside its entity's key tree fails here.
import { QueryClient } from "@tanstack/react-query";
import { describe, expect, it } from "vitest";
import { shotKeys, shotMarksSaved, shotsChanged } from "@/entities/shot";
import { stickChanged } from "@/entities/stick";
import { clipChanged } from "@/entities/clip";
import { readoutQueryOptions } from "@/features/readout/api/readout";
import { shotsQueryOptions } from "@/entities/shot";
import { compareQueryOptions } from "@/features/compare/api/compare";
import { shotChoicesQueryOptions } from "@/features/compare/api/shotChoices";
import { progressQueryOptions } from "@/features/progress/api/progress";
import { playersQueryOptions } from "@/entities/member/players";
import { shotBeamQueryOptions } from "@/features/sticklab/api/shotBeam";
import { clipShotsQueryOptions } from "@/features/digitise/api/clipShots";
import { shotQueryOptions } from "@/features/digitise/api/shot";
import { homeQueryOptions } from "@/features/home/api/home";
import { stickQueryOptions } from "@/features/sticklab/api/stick";
import { sticksQueryOptions } from "@/features/sticklab/api/sticks";
import type { ShotDetail } from "@shared/schemas/shots";

const T = "team-1";
const OTHER = "team-2";

/** Every page showing shots' numbers, each with a cached answer that is fresh (not stale). */
function seeded() {
  const qc = new QueryClient({ defaultOptions: { queries: { staleTime: 30_000 } } });
  const views = {
    readout: readoutQueryOptions(T, "s1").queryKey,
    shotsList: shotsQueryOptions(T, { page: 1, pageSize: 25 } as never).queryKey,
    compare: compareQueryOptions(T, "s1", "s2").queryKey,
    compareChoices: shotChoicesQueryOptions(T).queryKey,
    progress: progressQueryOptions(T, { playerId: "p1" } as never).queryKey,
    players: playersQueryOptions(T).queryKey,
    beamFromShot: shotBeamQueryOptions(T, "s1").queryKey,
    clipShots: clipShotsQueryOptions(T, "c1").queryKey,
    document: shotQueryOptions(T, "s1").queryKey,
    // Home's items are shots (waiting for review, latest results, shared with me): a shot
    // published or taken back must show there without a reload.
    home: homeQueryOptions(T).queryKey,
  };
  const put = (k: readonly unknown[]) => qc.setQueryData<unknown>(k, { cached: true });
  for (const k of Object.values(views)) put(k);
  put(readoutQueryOptions(OTHER, "s9").queryKey);
  put(stickQueryOptions(T, "k1").queryKey);
  put(sticksQueryOptions(T).queryKey);
  const stale = (k: readonly unknown[]) => qc.getQueryState(k)?.isInvalidated === true;
  return { qc, views, stale };
}

describe("client entities: one call refreshes every view of the change", () => {
  it("shots changed (a shot deleted or added, published, a share): readout, Shots list, side by side, progress, beam, the clip's shots, home", async () => {
    const { qc, views, stale } = seeded();
    await shotsChanged(qc, T);
    for (const [name, k] of Object.entries(views)) expect(stale(k), name).toBe(true);
    expect(stale(readoutQueryOptions(OTHER, "s9").queryKey), "another team's cache").toBe(false);
  });

  it("marks saved: the document takes the saved version at once; every other view refetches", async () => {
    const { qc, views, stale } = seeded();
    const doc = { id: "s1", marks: {}, events: {}, version: 3, storedResult: null } as unknown as ShotDetail;
    qc.setQueryData(views.document, doc);
    const saved = { marks: { puck: [[10, 1, 2]] }, events: { puckStrike: 10 } } as Pick<ShotDetail, "marks" | "events">;
    await shotMarksSaved(qc, T, "s1", saved, { version: 4, updatedAt: "2026-12-03T10:00:00Z", updatedByName: "Priya Lindqvist", storedResult: null } as never);
    expect(qc.getQueryData<ShotDetail>(views.document)).toMatchObject({ version: 4, marks: saved.marks, events: saved.events, updatedByName: "Priya Lindqvist" });
    expect(stale(views.document), "the written-through document").toBe(false);
    for (const [name, k] of Object.entries(views)) if (name !== "document") expect(stale(k), name).toBe(true);
  });

  it("a bench test added (a stick changed): the stick lab and every view of shots (stiffness in force)", async () => {
    const { qc, views, stale } = seeded();
    await stickChanged(qc, T);
    expect(stale(stickQueryOptions(T, "k1").queryKey)).toBe(true);
    expect(stale(sticksQueryOptions(T).queryKey)).toBe(true);
    for (const [name, k] of Object.entries(views)) expect(stale(k), name).toBe(true);
  });

  it("a clip changed (calibration, player): its shots' numbers too", async () => {
    const { qc, views, stale } = seeded();
    await clipChanged(qc, T);
    for (const [name, k] of Object.entries(views)) expect(stale(k), name).toBe(true);
    expect(stale(sticksQueryOptions(T).queryKey)).toBe(false);
  });

  it("every shot key sits under the team's shots branch", () => {
    const { views } = seeded();
    for (const [name, k] of Object.entries(views)) expect(k.slice(0, 3), name).toEqual(shotKeys.all(T));
  });
});
