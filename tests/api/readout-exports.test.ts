// Exports of a shot: marks CSV (frame, time by the capture rate, pixels and world coordinates),
// results CSV and the one-page PDF, in the viewer's units; the same visibility as the readout.
import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { parse as parseCsv } from "csv-parse/sync";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertShotWithResults } from "./routes/readout";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";
import { MAX_REPORTS_AT_ONCE, renderShotReport } from "../../server/readout/pdf/render";
import { HttpError } from "../../server/http/problem";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client, player: Client, player2: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  coach = await new Client(srv.url).signIn(EMAILS.coach);
  player = await new Client(srv.url).signIn(EMAILS.player);
  player2 = await new Client(srv.url).signIn(EMAILS.player2);
});
afterAll(() => srv.close());

const R = () => `/api/teams/${world.teamId}/readout`;
const uid = (email: string) => world.users[email];
const rowsOf = (text: string) => parseCsv(text, { columns: true, skip_empty_lines: true }) as Record<string, string>[];

/** The raw bytes of a download (the test client reads text, which would mangle a PDF). */
async function download(email: string, p: string) {
  const signIn = await fetch(`${srv.url}/api/auth/sign-in/email`, {
    method: "POST", headers: { "content-type": "application/json", origin: "http://127.0.0.1:3000" }, body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  const res = await fetch(srv.url + p, { headers: { cookie, origin: "http://127.0.0.1:3000" } });
  return { status: res.status, type: res.headers.get("content-type") ?? "", disposition: res.headers.get("content-disposition") ?? "", bytes: Buffer.from(await res.arrayBuffer()) };
}

function pdfText(bytes: Buffer) {
  const dir = mkdtempSync(path.join(tmpdir(), "readout-pdf-"));
  const file = path.join(dir, "report.pdf");
  writeFileSync(file, bytes);
  // poppler-utils (Debian) as the independent reader of the file.
  return { text: execFileSync("pdftotext", ["-layout", file, "-"]).toString(), info: execFileSync("pdfinfo", [file]).toString() };
}

describe("marks CSV", () => {
  it("every mark with its time by the capture rate and its position in mm (or in) from the scale bar", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Export slap" });
    const r = await player.get(`${R()}/shots/${s.shotId}/marks.csv?units=metric`);
    expect(r.status, r.text).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(r.headers.get("content-disposition")).toBe('attachment; filename="export-slap-marks.csv"');
    const rows = rowsOf(r.text);
    const total = Object.values(s.scene.marks).reduce((n, t) => n + t.length, 0);
    expect(rows).toHaveLength(total);
    expect(Object.keys(rows[0])).toEqual(["frame", "time_ms", "time_from_puck_strike_ms", "landmark", "x_px", "y_px", "x_mm", "y_mm"]);
    // Independent check of one mark: scale bar from a to b (horizontal here), x right and y up in mm.
    const { a, b, lengthMm } = s.scene.calibration;
    const mmPerPx = lengthMm / Math.hypot(b[0] - a[0], b[1] - a[1]);
    const [f, x, y] = s.scene.marks.puck[300];
    const row = rows.find((q) => q.landmark === "Puck" && Number(q.frame) === f)!;
    expect(Number(row.time_ms)).toBeCloseTo(((f - 1) / 3200) * 1000, 3);
    expect(Number(row.time_from_puck_strike_ms)).toBeCloseTo(((f - s.scene.events.puckStrike) / 3200) * 1000, 3);
    expect(Number(row.x_px)).toBeCloseTo(x, 3);
    expect(Number(row.x_mm)).toBeCloseTo((x - a[0]) * mmPerPx, 2);
    expect(Number(row.y_mm)).toBeCloseTo(-(y - a[1]) * mmPerPx, 2);
    // Sorted by frame.
    const frames = rows.map((q) => Number(q.frame));
    expect(frames).toEqual([...frames].sort((p, q) => p - q));

    // Imperial: 1 in = 25.4 mm exactly (NIST SP 811) [P].
    const imp = rowsOf((await player.get(`${R()}/shots/${s.shotId}/marks.csv?units=imperial`)).text);
    const ri = imp.find((q) => q.landmark === "Puck" && Number(q.frame) === f)!;
    expect(Number(ri.x_in)).toBeCloseTo(((x - a[0]) * mmPerPx) / 25.4, 3);
  });

  it("without a calibration the world columns stay empty; the results and the PDF say what is missing", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), uncalibrated: true });
    const rows = rowsOf((await player.get(`${R()}/shots/${s.shotId}/marks.csv`)).text);
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((q) => q.x_mm === "" && q.y_mm === "" && q.x_px !== "")).toBe(true);
    for (const p of ["results.csv", "report.pdf"]) {
      const r = await player.get(`${R()}/shots/${s.shotId}/${p}`);
      expect(r.status).toBe(409);
      expect(r.json.code).toBe("no_results");
      expect(r.json.detail).toMatch(/no results yet.*calibration/);
    }
  });
});

describe("results CSV", () => {
  it("each result with its uncertainty and 95 % interval, in the viewer's preferred units", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Results export" });
    const metric = rowsOf((await player.get(`${R()}/shots/${s.shotId}/results.csv?units=metric`)).text);
    const pes = metric.find((q) => q.result === "Puck exit speed")!;
    // 1 km/h = 1/3.6 m/s exactly [P].
    expect(Number(pes.value)).toBeCloseTo(s.results!.puckExitSpeed.valueMps * 3.6, 3);
    expect(Number(pes.uncertainty)).toBeCloseTo(s.results!.puckExitSpeed.uncertaintyMps! * 3.6, 3);
    expect(Number(pes.interval95_low)).toBeCloseTo(s.results!.puckExitSpeed.interval95Mps![0] * 3.6, 3);
    expect(pes.unit).toBe("km/h");
    expect(metric.find((q) => q.result === "Contact time")).toMatchObject({ value: "30", unit: "ms" });
    expect(metric.find((q) => q.result === "Stored energy")).toMatchObject({ value: "", note: "not available for this shot" });

    // No units asked: the person's preference (imperial here); 1 mph = 0.44704 m/s exactly [P].
    expect((await player2.patch("/api/me/prefs", { units: "imperial" })).status).toBe(200);
    const mine = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "Imperial export" });
    const imp = rowsOf((await player2.get(`${R()}/shots/${mine.shotId}/results.csv`)).text);
    const p2 = imp.find((q) => q.result === "Puck exit speed")!;
    expect(p2.unit).toBe("mph");
    expect(Number(p2.value)).toBeCloseTo(mine.results!.puckExitSpeed.valueMps / 0.44704, 3);
    expect(imp.find((q) => q.result === "Shaft deflection")!.unit).toBe("in");
  });
});

describe("PDF report", () => {
  it("one page whose text holds the puck exit speed in the viewer's units", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Report slap" });
    const got = await download(EMAILS.player, `${R()}/shots/${s.shotId}/report.pdf?units=metric`);
    expect(got.status).toBe(200);
    expect(got.type).toBe("application/pdf");
    expect(got.disposition).toBe('attachment; filename="report-slap-report.pdf"');
    expect(got.bytes.subarray(0, 5).toString()).toBe("%PDF-");
    const { text, info } = pdfText(got.bytes);
    expect(info).toMatch(/Pages:\s+1\n/);
    const kmh = (s.results!.puckExitSpeed.valueMps * 3.6).toFixed(1);
    const u = (s.results!.puckExitSpeed.uncertaintyMps! * 3.6).toFixed(1);
    expect(text).toContain("Puck exit speed");
    expect(text).toMatch(new RegExp(`${kmh.replace(".", "\\.")}\\s+± ${u.replace(".", "\\.")} km/h`));
    expect(text).toContain("Report slap");
    expect(text).toContain("Theo Marchetti");
    expect(text).toMatch(/Ice strike[\s\S]*Puck strike[\s\S]*Peak bend[\s\S]*Release/);

    const imp = pdfText((await download(EMAILS.player, `${R()}/shots/${s.shotId}/report.pdf?units=imperial`)).bytes).text;
    expect(imp).toContain(`${(s.results!.puckExitSpeed.valueMps / 0.44704).toFixed(1)}`);
    expect(imp).toContain("mph");
    expect(imp).not.toContain("km/h");
  });

  it("more reports at once than a process makes: the extra ones are refused at once as busy, the rest are made (in worker threads)", async () => {
    const s = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), label: "Many reports" });
    const readout = (await coach.get(`${R()}/shots/${s.shotId}`)).json;
    const input = { readout, units: "metric" as const, teamName: "Lakeport Ravens", url: "http://127.0.0.1:3000/x", generatedAt: new Date(), thumbs: {} };
    const out = await Promise.all(Array.from({ length: MAX_REPORTS_AT_ONCE + 2 }, () => renderShotReport(input).catch((e: unknown) => e)));
    const busy = out.filter((o) => o instanceof HttpError);
    expect(busy.map((e) => [(e as HttpError).status, (e as HttpError).code])).toEqual([[503, "busy"], [503, "busy"]]);
    const pdfs = out.filter((o): o is Buffer => Buffer.isBuffer(o));
    expect(pdfs).toHaveLength(MAX_REPORTS_AT_ONCE);
    for (const pdf of pdfs) expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    expect(pdfText(pdfs[0]).text).toContain("Many reports");
  });

  it("a shot one may not see: 404 for every export, nothing of it in the answer", async () => {
    const theirs = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player2), label: "Jonah only" });
    for (const p of ["marks.csv", "results.csv", "report.pdf"]) {
      const r = await player.get(`${R()}/shots/${theirs.shotId}/${p}`);
      expect(r.status, p).toBe(404);
      expect(r.headers.get("content-type")).toMatch(/problem\+json/);
      expect(r.text).not.toContain("Jonah only");
    }
    expect((await coach.get(`${R()}/shots/${theirs.shotId}/marks.csv`)).status).toBe(200);
    expect((await coach.get(`${R()}/shots/${theirs.shotId}/results.csv?units=furlongs`)).status).toBe(422);
  });
});
