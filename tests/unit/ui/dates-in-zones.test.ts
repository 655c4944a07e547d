// Calendar dates (a session's date, a bench test's day) are shown as written in every time zone;
// "today" is the viewer's own day. Run in the zones where a UTC midnight lands on the wrong day:
// west of UTC (Vancouver, a day early) and far east (Auckland, a day late in charts).
import { afterEach, describe, expect, it, vi } from "vitest";

const zones = ["America/Vancouver", "Pacific/Auckland", "UTC"];
const original = process.env.TZ;
afterEach(() => {
  process.env.TZ = original;
  vi.useRealTimers();
  vi.resetModules();
});

/** Loads the modules fresh in `zone` (their formatters take the zone when they are made). */
async function inZone(zone: string) {
  process.env.TZ = zone;
  vi.resetModules();
  return {
    format: await import("../../../src/lib/format"),
    metaForm: await import("../../../src/features/clips/upload/metaForm"),
    clipsFormat: await import("../../../src/features/clips/format"),
  };
}

const dayOf = (text: string) => {
  // Locale-independent enough: the formatted text must hold day 1, March and 2026, never 28 Feb or 2 Mar.
  expect(text).toMatch(/2026/);
  expect(text).toMatch(/\b1\b/);
  expect(text).toMatch(/Mar/);
};

describe.each(zones)("in %s", (zone) => {
  it("a calendar date is shown as written", async () => {
    const { format, clipsFormat } = await inZone(zone);
    dayOf(format.formatDate("2026-03-01"));
    dayOf(clipsFormat.sessionLabel({ date: "2026-03-01", venue: "", drill: "" }));
  });

  it("a chart's day value shows the same day", async () => {
    const { format } = await inZone(zone);
    dayOf(format.formatDate(new Date(format.dayValue("2026-03-01")).toISOString()));
  });

  it("the clip form's today is the viewer's own day", async () => {
    // 11:30 UTC on 1 March is 03:30 on 1 March in Vancouver and 00:30 on 2 March in Auckland.
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-03-01T11:30:00Z"));
    const { metaForm } = await inZone(zone);
    const local = new Date();
    const expected = `${local.getFullYear()}-${String(local.getMonth() + 1).padStart(2, "0")}-${String(local.getDate()).padStart(2, "0")}`;
    expect(metaForm.today()).toBe(expected);
    expect(metaForm.today()).toBe(zone === "Pacific/Auckland" ? "2026-03-02" : "2026-03-01");
  });
});
