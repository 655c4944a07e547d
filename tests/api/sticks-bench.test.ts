// Bench tests over HTTP: readings typed into the table (JSON) and uploaded as a CSV (multipart),
// and every kind of bad CSV: each gets a 422 with the engine's message and nothing is stored.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { db } from "../../server/db/client";
import { benchTest } from "../../server/db/schema";
import { eq } from "drizzle-orm";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client, analyst: Client;
let stickId: string;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  [coach, analyst] = await Promise.all([EMAILS.coach, EMAILS.analyst].map((e) => new Client(srv.url).signIn(e)));
  const s = await coach.post(`/api/teams/${world.teamId}/sticks`, { label: "Used 85", ratedFlex: 85, ownerId: world.users[EMAILS.player] });
  stickId = s.json.id;
});
afterAll(() => srv.close());

const base = () => `/api/teams/${world.teamId}/sticks/${stickId}`;
const stored = async () => (await db().select().from(benchTest).where(eq(benchTest.stickId, stickId))).length;

function csvForm(csv: string, fields: Record<string, string> = { date: "2026-11-20" }, name = "readings.csv") {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set("file", new Blob([csv], { type: "text/csv" }), name);
  return form;
}
const upload = (form: FormData) => analyst.request("POST", `${base()}/bench-tests/csv`, form);

describe("bench test from the table", () => {
  it("fits four hung weights on a used 85 flex to ~71 flex, 84 % of rated", async () => {
    // Four weights, deflection read under the load at mid-span of 1,000 mm. 20 lbf per 0.28 in is
    // 71.43 lbf/in, and a flex number is lbf per inch at mid-span [CP], so 71.43 flex = 84.0 % of 85.
    const before = await stored();
    const r = await analyst.post(`${base()}/bench-tests`, {
      date: "2026-11-21",
      loadUnit: "lbf",
      deflectionUnit: "in",
      readings: [
        { load: 20, deflection: 0.28 },
        { load: 40, deflection: 0.56 },
        { load: 60, deflection: 0.84 },
        { load: 80, deflection: 1.12 },
      ],
    });
    expect(r.status, r.text).toBe(201);
    expect(r.json).toMatchObject({ testedOn: "2026-11-21", spanMm: 1000, loadPointMm: 500, entry: { source: "table", loadUnit: "lbf", deflectionUnit: "in" } });
    expect(r.json.fit.stiffnessLbfPerIn).toBeCloseTo(20 / 0.28, 9);
    expect(r.json.fit.measuredFlex).toBeCloseTo(20 / 0.28, 9);
    expect(r.json.fit.percentOfRated).toBeCloseTo((100 * 20) / 0.28 / 85, 9);
    expect(Math.round(r.json.fit.percentOfRated)).toBe(84);
    expect(r.json.fit.r2).toBeCloseTo(1, 12);
    expect(r.json.fit.residualsLbf).toHaveLength(4);
    expect(r.json.readings[0].loadN).toBeCloseTo(20 * 4.4482216152605, 12); // 1 lbf = 4.4482216152605 N exactly [P]
    expect(r.json.createdBy.name).toBe("Priya Lindqvist");
    expect(await stored()).toBe(before + 1);

    const detail = (await coach.get(base())).json;
    expect(detail.stick.latest).toMatchObject({ benchTestId: r.json.id, testedOn: "2026-11-21" });
    expect(detail.stick.belowAlert).toBe(true);
  });

  it("normalises a test on another span to the rating's 1,000 mm centre load (k ∝ 1/L³, Cross & Lindsey 2016) [P]", async () => {
    // On a 500 mm span the same shaft needs 8× the force for the same deflection.
    const r = await analyst.post(`${base()}/bench-tests`, {
      date: "2026-11-22",
      spanMm: 500,
      loadUnit: "lbf",
      deflectionUnit: "in",
      readings: [80, 160, 240].map((load) => ({ load, deflection: load / (8 * 70) })),
    });
    expect(r.status, r.text).toBe(201);
    expect(r.json.fit.stiffnessLbfPerIn).toBeCloseTo(560, 9);
    expect(r.json.fit.measuredFlex).toBeCloseTo(70, 9);
  });

  it("refuses bad table readings and a load point off the span with 422, storing nothing", async () => {
    const before = await stored();
    const cases: [unknown, RegExp][] = [
      [[{ load: 20, deflection: 0.3 }, { load: -40, deflection: 0.6 }, { load: 60, deflection: 0.9 }], /row 2: load must be greater than zero/],
      [[{ load: 20, deflection: 0.3 }, { load: 40, deflection: 0.6 }], /at least 3/],
      [[{ load: 20, deflection: 0.3 }, { load: 20, deflection: 0.6 }, { load: 20, deflection: 0.9 }], /all loads are equal/],
      [[{ load: 20, deflection: 0.3 }, { load: "x", deflection: 0.6 }, { load: 60, deflection: 0.9 }], /number/],
    ];
    for (const [readings, message] of cases) {
      const r = await analyst.post(`${base()}/bench-tests`, { date: "2026-11-21", loadUnit: "lbf", deflectionUnit: "in", readings });
      expect(r.status, r.text).toBe(422);
      expect(r.json.code, "one failure, one code").toBe("validation_failed");
      expect(r.json.detail).toMatch(message);
      expect(r.json.errors[0].path).toMatch(/^readings/);
    }
    const off = await analyst.post(`${base()}/bench-tests`, { date: "2026-11-21", spanMm: 1000, loadPointMm: 1200, loadUnit: "N", deflectionUnit: "mm", readings: [{ load: 50, deflection: 3 }, { load: 100, deflection: 6 }, { load: 150, deflection: 9 }] });
    expect(off.status).toBe(422);
    expect(off.json.errors[0].path).toBe("loadPointMm");
    const future = await analyst.post(`${base()}/bench-tests`, { date: "2099-01-01", loadUnit: "N", deflectionUnit: "mm", readings: [{ load: 50, deflection: 3 }, { load: 100, deflection: 6 }, { load: 150, deflection: 9 }] });
    expect(future.status).toBe(422);
    expect(future.json.detail).toMatch(/in the future/);
    expect(await stored()).toBe(before);
  });
});

describe("bench test from a CSV upload", () => {
  it("stores a metric CSV with its file name and fits it", async () => {
    const k = (71.4 * 175.1268352) / 1000; // 71.4 flex in N/mm (1 lbf/in = 175.127 N/m, REFERENCES.md calc)
    const csv = "load_n,deflection_mm,note\n" + [50, 100, 150, 200].map((f) => `${f},${(f / k).toFixed(4)},hung`).join("\n") + "\n";
    const r = await upload(csvForm(csv, { date: "2026-11-23", spanMm: "1000" }, "season-end.csv"));
    expect(r.status, r.text).toBe(201);
    expect(r.json.entry).toEqual({ source: "csv", loadUnit: "N", deflectionUnit: "mm", fileName: "season-end.csv" });
    expect(r.json.fit.measuredFlex).toBeCloseTo(71.4, 2);
    expect(r.json.fit.n).toBe(4);
  });

  const huge = "load_lbf,deflection_in\n" + "20,0.28\n".repeat(140_000); // ~1.1 MB
  const badCsvs: [string, string, RegExp][] = [
    ["missing columns", "load_lbf\n20\n40\n60\n", /missing column deflection_in or deflection_mm/],
    ["unknown units", "load_kg,deflection_in\n20,0.28\n40,0.56\n60,0.84\n", /column "load_kg": unknown unit "kg"/],
    ["text in a number cell", "load_lbf,deflection_in\n20,0.28\n40,about half\n60,0.84\n", /line 3, column deflection_in: "about half" is not a number/],
    ["a negative load", "load_lbf,deflection_in\n20,0.28\n-40,0.56\n60,0.84\n", /line 3: load must be greater than zero/],
    ["a zero load", "load_lbf,deflection_in\n0,0\n40,0.56\n60,0.84\n", /line 2: load must be greater than zero/],
    ["fewer than 3 readings", "load_lbf,deflection_in\n20,0.28\n40,0.56\n", /need at least 3 readings/],
    ["all loads equal", "load_lbf,deflection_in\n40,0.5\n40,0.56\n40,0.6\n", /all loads are equal/],
    ["an empty file", "", /the file is empty/],
    ["a header only", "load_lbf,deflection_in\n", /need at least 3 readings/],
    ["a huge file", huge, /the file is too large: more than 1000000 bytes/],
    ["a short row", "load_lbf,deflection_in\n20,0.28\n40\n60,0.84\n", /line 3 has 1 cell but the header has 2/],
  ];
  it.each(badCsvs)("refuses %s with a 422 and stores nothing", async (_name, csv, message) => {
    const before = await stored();
    const r = await upload(csvForm(csv));
    expect(r.status, r.text).toBe(422);
    expect(r.headers.get("content-type")).toMatch(/problem\+json/);
    expect(r.json.code, "the same code as a missing file or date").toBe("validation_failed");
    expect(r.json.detail).toMatch(message);
    expect(r.json.errors[0].path).toBe("file");
    expect(await stored()).toBe(before);
  });

  it("refuses an upload without a file, without a date, or with the file in another field", async () => {
    const before = await stored();
    const noFile = new FormData();
    noFile.set("date", "2026-11-20");
    const r1 = await upload(noFile);
    expect(r1.status).toBe(422);
    expect(r1.json.code).toBe("validation_failed");
    expect(r1.json.errors[0].path).toBe("file");

    const r2 = await upload(csvForm("load_lbf,deflection_in\n20,0.28\n40,0.56\n60,0.84\n", {}));
    expect(r2.status).toBe(422);
    expect(r2.json.errors[0].path).toBe("date");

    const wrong = new FormData();
    wrong.set("date", "2026-11-20");
    wrong.set("readings", new Blob(["load_lbf,deflection_in\n"]), "r.csv");
    const r3 = await upload(wrong);
    expect(r3.status).toBe(422);
    expect(r3.json.detail).toMatch(/in the field "file"/);
    expect(await stored()).toBe(before);
  });

  it("deletes a bench test (staff), logs it and updates the latest", async () => {
    const detail = (await coach.get(base())).json;
    const last = detail.benchTests.at(-1);
    expect((await coach.del(`${base()}/bench-tests/${last.id}`)).status).toBe(204);
    const after = (await coach.get(base())).json;
    expect(after.benchTests).toHaveLength(detail.benchTests.length - 1);
    expect(after.stick.latest.benchTestId).not.toBe(last.id);
    expect((await coach.del(`${base()}/bench-tests/${last.id}`)).status).toBe(404);
  });
});
