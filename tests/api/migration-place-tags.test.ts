// The migration that takes place tags out of clips stored before uploads dropped them
// (drizzle/0003_strip_place_tags_from_probes.sql), run again over rows that carry them.
import { beforeAll, describe, expect, it } from "vitest";
import { seedWorld } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { rerunMigration } from "./rerun-migration";

let world: Awaited<ReturnType<typeof seedWorld>>;
beforeAll(async () => {
  world = await seedWorld();
});

describe("migration 0003: place tags out of stored probes", () => {
  it("drops location, GPS and ISO 6709 tags from the format and every stream, keeps the rest", async () => {
    const { db } = await import("../../server/db/client");
    const { clip } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    const id = await insertReadyClip(world.teamId, {});
    const probe = {
      codec: "h264",
      raw: {
        format: { format_name: "mov", tags: { location: "+45.5017-073.5673/", "com.apple.quicktime.location.ISO6709": "+45.5017-073.5673+030.000/", title: "Drill 4" } },
        streams: [{ index: 0, tags: { rotate: "90", "location-eng": "+45.5017-073.5673/" } }, { index: 1 }],
      },
    };
    const [other] = await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, probe: { raw: { streams: [] } } }).returning({ id: clip.id });
    await db().update(clip).set({ probe }).where(eq(clip.id, id));

    await rerunMigration("drizzle/0003_strip_place_tags_from_probes.sql");

    const [row] = await db().select({ probe: clip.probe }).from(clip).where(eq(clip.id, id));
    expect(JSON.stringify(row.probe)).not.toContain("45.5017");
    expect(row.probe).toEqual({
      codec: "h264",
      raw: { format: { format_name: "mov", tags: { title: "Drill 4" } }, streams: [{ index: 0, tags: { rotate: "90" } }, { index: 1 }] },
    });
    const [untouched] = await db().select({ probe: clip.probe }).from(clip).where(eq(clip.id, other.id));
    expect(untouched.probe).toEqual({ raw: { streams: [] } });
  });
});
