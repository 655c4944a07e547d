// The migration that turns stored chart series from objects into columns
// (drizzle/0021_series_columns.sql), run again over rows written the old way.
import { beforeAll, describe, expect, it } from "vitest";
import { ShotResults, syntheticShot, computeShot } from "../../shared/mechanics/index";
import { seriesPoints } from "../../shared/mechanics/series-columns";
import { seedWorld } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { rerunMigration } from "./rerun-migration";

let world: Awaited<ReturnType<typeof seedWorld>>;
beforeAll(async () => {
  world = await seedWorld();
});

/** The series as stored before decision 202: an object a sample, every number at full precision. */
type OldPoint = { tMs: number; frame: number; value: number; segment: string; tFromStrikeMs: number };
const oldPoints = (s: ShotResults["series"]["puckSpeed"], firstMs: number): OldPoint[] =>
  seriesPoints(s).map((p, i) => ({ tMs: firstMs + p.tFromStrikeMs, frame: p.frame, value: p.value * (1 + 1e-9 * i) + 1 / 3e7, segment: p.segment, tFromStrikeMs: p.tFromStrikeMs + 1 / 3e9 }));

describe("migration 0021: chart series as columns", () => {
  it("turns each series' points into frame, time and value columns with runs of segments, to the engine's digits", async () => {
    const { db } = await import("../../server/db/client");
    const { shot, shotResult } = await import("../../server/db/schema");
    const { eq, sql } = await import("drizzle-orm");
    const fresh = computeShot(syntheticShot({ frames: 240, noisePx: 0.3, seed: "mig" }).doc, { trials: 30 });
    const old = {
      ...fresh,
      series: {
        firstFrame: fresh.series.firstFrame,
        puckSpeed: { unit: "m/s", points: oldPoints(fresh.series.puckSpeed, 40) },
        bladeSpeed: { unit: "m/s", points: oldPoints(fresh.series.bladeSpeed, 40) },
        bendAngle: { unit: "deg", points: [] },
      },
    };
    const clipId = await insertReadyClip(world.teamId, {});
    const made = [];
    for (const label of ["old", "error", "new"]) {
      const [s] = await db().insert(shot).values({ teamId: world.teamId, clipId, label }).returning();
      made.push(s.id);
    }
    await db().insert(shotResult).values([
      { shotId: made[0], teamId: world.teamId, engineVersion: "mechanics-1.2.1", shotVersion: 1, results: old },
      { shotId: made[1], teamId: world.teamId, engineVersion: "mechanics-1.2.1", shotVersion: 1, results: null, error: "Mark the puck in two more frames." },
      { shotId: made[2], teamId: world.teamId, engineVersion: "mechanics-1.2.1", shotVersion: 1, results: fresh },
    ]);
    const text = async (id: string) => (await db().execute<{ t: string | null }>(sql`select results::text as t from shot_result where shot_id = ${id}`)).rows[0].t;
    const before = [await text(made[1]), await text(made[2])];

    await rerunMigration("drizzle/0021_series_columns.sql");

    const [row] = await db().select({ results: shotResult.results }).from(shotResult).where(eq(shotResult.shotId, made[0]));
    const got = ShotResults.parse(row.results); // the engine's shape, as the readout checks it
    for (const k of ["puckSpeed", "bladeSpeed"] as const) {
      const was = old.series[k].points;
      const now = seriesPoints(got.series[k]);
      expect(now.map((p) => [p.frame, p.segment])).toEqual(was.map((p) => [p.frame, p.segment]));
      now.forEach((p, i) => {
        expect(Math.abs(p.value - was[i].value) / Math.abs(was[i].value)).toBeLessThanOrEqual(5e-6); // 6 significant digits
        expect(Math.abs(p.tFromStrikeMs - was[i].tFromStrikeMs)).toBeLessThanOrEqual(5e-7 + 1e-12); // the ns
      });
      // The same digits the engine writes today for the same numbers (series-columns.ts).
      expect(got.series[k].value).toEqual(was.map((p) => Number(p.value.toPrecision(6))));
      expect(got.series[k].segments.length).toBeLessThan(5);
    }
    expect(got.series.bendAngle).toEqual({ unit: "deg", frame: [], tFromStrikeMs: [], value: [], segments: [] });
    expect(got.series.firstFrame).toBe(fresh.series.firstFrame);
    expect({ ...got, series: null }).toEqual({ ...JSON.parse(JSON.stringify(fresh)), series: null });
    expect(JSON.stringify(got).length).toBeLessThan(JSON.stringify(old).length / 2.5);
    // Rows with no points (an error, or results already in columns) keep their exact text.
    expect([await text(made[1]), await text(made[2])]).toEqual(before);
  });
});
