import { useMemo, useState } from "react";
import { useNavigate } from "react-router-dom";
import { BENCH_LOADING_CAUTION, DEFAULT_BENCH_SPAN_MM, StickLabInputError, fitBench, parseReadingsCsv, type ParsedReadings } from "@shared/mechanics/sticklab";
import type { StickDetail } from "@shared/schemas/sticks";
import { Alert, Button, Card, EmptyState, Field, Input, PageHeader, Select, toast } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { cn } from "@/lib/cn";
import { useUnits } from "@/lib/units";
import { useAddBenchTest } from "../api/addBenchTest";
import { BenchResult } from "../components/BenchResult";
import { blankRows, ReadingsEditor, type ReadingRow } from "../components/ReadingsEditor";
import { BackToStick, StickLoadState } from "../components/StickLoadState";
import { useStickRoute } from "../components/useStickRoute";
import { benchUnits, benchUnitsFor, lengthFromMm, lengthToMm, type BenchUnits } from "../lib/bench-units";
import { formatNumber, todayIso } from "../lib/format";
import { previewFit, rowsToRaw, type Preview } from "../lib/preview";

export function Component() {
  const { teamId, stickId, stick } = useStickRoute();
  if (!stick.data) return <StickLoadState query={stick} />;
  if (!stick.data.canEdit)
    return <EmptyState title="Bench tests are run by the team's staff">Ask your coach or analyst to test this stick; the result shows on its page.</EmptyState>;
  return <BenchTestForm teamId={teamId} stickId={stickId} detail={stick.data} />;
}

type Mode = "table" | "csv";

function BenchTestForm({ teamId, stickId, detail }: { teamId: string; stickId: string; detail: StickDetail }) {
  const { system, unit } = useUnits();
  const navigate = useNavigate();
  const save = useAddBenchTest(teamId, stickId);
  const { stick } = detail;
  const lengthDigits = system === "imperial" ? 2 : 0;
  const [mode, setMode] = useState<Mode>("table");
  const [date, setDate] = useState(todayIso());
  const defaultSpan = formatNumber(lengthFromMm(system, DEFAULT_BENCH_SPAN_MM), lengthDigits).replace(/,/g, "");
  const [span, setSpan] = useState(defaultSpan);
  const [loadPoint, setLoadPoint] = useState("");
  const [units, setUnits] = useState<BenchUnits>(benchUnitsFor(system));
  const [rows, setRows] = useState<ReadingRow[]>(blankRows(4));
  const [csv, setCsv] = useState<{ file: File; parsed: ParsedReadings | null; error: string | null } | null>(null);
  const [serverError, setServerError] = useState<string | null>(null);

  // The default stays exactly 1,000 mm: 39.37 in read back would be 999.998 mm.
  const spanMm = span === defaultSpan ? DEFAULT_BENCH_SPAN_MM : lengthToMm(system, Number(span));
  const loadPointMm = loadPoint.trim() === "" ? undefined : lengthToMm(system, Number(loadPoint));
  const geometryProblem =
    !(spanMm > 0) ? "Enter the distance between the supports." : loadPointMm !== undefined && !(loadPointMm > 0 && loadPointMm < spanMm) ? "The load point must lie between the supports." : null;

  const tableRaw = useMemo(() => rowsToRaw(rows), [rows]);
  const preview: Preview | null = useMemo(() => {
    if (geometryProblem) return { ok: false, message: geometryProblem };
    const options = { spanMm, loadPointMm, ratedFlex: stick.ratedFlex };
    if (mode === "csv") {
      if (!csv) return null;
      if (!csv.parsed) return { ok: false, message: csv.error ?? "The file could not be read." };
      try {
        return { ok: true, readings: csv.parsed.readings, fit: fitBench(csv.parsed.readings, options) };
      } catch (e) {
        return { ok: false, message: e instanceof StickLabInputError ? e.message : String(e) };
      }
    }
    if ("message" in tableRaw) return { ok: false, message: tableRaw.message, row: tableRaw.row };
    if (tableRaw.raw.length === 0) return null;
    return previewFit(tableRaw.raw, units, options);
  }, [geometryProblem, spanMm, loadPointMm, stick.ratedFlex, mode, csv, tableRaw, units]);

  const chooseFile = async (file: File | undefined) => {
    setServerError(null);
    if (!file) return setCsv(null);
    try {
      setCsv({ file, parsed: parseReadingsCsv(new Uint8Array(await file.arrayBuffer())), error: null });
    } catch (e) {
      setCsv({ file, parsed: null, error: e instanceof StickLabInputError ? e.message : errorMessage(e) });
    }
  };

  const submit = () => {
    setServerError(null);
    const geometry = { spanMm, ...(loadPointMm !== undefined ? { loadPointMm } : {}) };
    const submission =
      mode === "csv"
        ? { kind: "csv" as const, upload: { file: csv!.file, date, ...geometry } }
        : {
            kind: "table" as const,
            body: { date, ...geometry, loadUnit: benchUnits[units].load, deflectionUnit: benchUnits[units].deflection, readings: "raw" in tableRaw ? tableRaw.raw : [] },
          };
    save.mutate(submission, {
      onSuccess: (t) => {
        toast.success(`Measured ${formatNumber(t.fit.measuredFlex, 1)} flex.`, "Bench test saved");
        navigate(`/sticks/${stickId}/bench-tests/${t.id}`);
      },
      onError: (e) => setServerError(errorMessage(e)),
    });
  };

  const canSave = preview?.ok === true && date !== "" && !save.isPending;
  const units0 = mode === "csv" && csv?.parsed ? (csv.parsed.units.load === "lbf" ? "imperial" : "metric") : units;

  return (
    <>
      <PageHeader eyebrow={<BackToStick to={`/sticks/${stickId}`} label={stick.label} />} title="New bench test" description="Three-point bend: the shaft on two supports, weights hung at the load point, deflection read under the load." />
      <Alert tone="warn" title="Safety first" className="mb-6">
        {BENCH_LOADING_CAUTION} If in doubt, ask the person in charge of the facility before you start.
      </Alert>

      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
        <div className="flex flex-col gap-6">
          <Card title="Set-up">
            <div className="grid grid-cols-2 gap-4">
              <Field label="Date of the test" className="col-span-2 sm:col-span-1">
                <Input type="date" value={date} max={todayIso()} onChange={(e) => setDate(e.target.value)} />
              </Field>
              <div className="hidden sm:block" />
              <Field label={`Span between supports (${unit("length")})`} hint={system === "imperial" ? "1,000 mm = 39.37 in: the rating's test" : "The rating's test uses 1,000 mm"}>
                <Input inputMode="decimal" value={span} onChange={(e) => setSpan(e.target.value)} />
              </Field>
              <Field label={`Load point (${unit("length")} from a support)`} hint="Leave empty for mid-span">
                <Input inputMode="decimal" value={loadPoint} placeholder="mid-span" onChange={(e) => setLoadPoint(e.target.value)} />
              </Field>
            </div>
          </Card>

          <Card
            title="Readings"
            description="At least three different loads; deflection measured from the unloaded shaft."
            actions={
              <div role="tablist" aria-label="How to enter the readings" className="flex rounded-lg border border-line-strong p-0.5 text-sm">
                {(["table", "csv"] as const).map((m) => (
                  <button
                    key={m}
                    role="tab"
                    aria-selected={mode === m}
                    className={cn("rounded-md px-3 py-1 font-medium", mode === m ? "bg-accent text-accent-ink" : "text-ink-muted hover:text-ink")}
                    onClick={() => setMode(m)}
                  >
                    {m === "table" ? "Type in" : "Upload CSV"}
                  </button>
                ))}
              </div>
            }
          >
            {mode === "table" ? (
              <div className="flex flex-col gap-4">
                <Field label="Units">
                  <Select value={units} onChange={(e) => setUnits(e.target.value as BenchUnits)}>
                    <option value="imperial">Load in lbf, deflection in inches</option>
                    <option value="metric">Load in N, deflection in mm</option>
                  </Select>
                </Field>
                <ReadingsEditor rows={rows} onChange={setRows} units={units} problemRow={preview && !preview.ok ? preview.row : undefined} />
              </div>
            ) : (
              <div className="flex flex-col gap-3 text-sm">
                <Field label="Readings file (.csv, up to 1 MB)">
                  <Input type="file" accept=".csv,text/csv" className="py-1.5" onChange={(e) => void chooseFile(e.target.files?.[0])} />
                </Field>
                <div className="rounded-lg bg-sunken/70 px-3 py-2 text-ink-muted">
                  <p>The header names the units, one reading per line:</p>
                  <pre className="mt-1 font-mono text-xs text-ink">{"load_lbf,deflection_in\n20,0.28\n40,0.56"}</pre>
                  <p className="mt-1">
                    or <code className="font-mono text-xs text-ink">load_n,deflection_mm</code>. Other columns are ignored.
                  </p>
                </div>
              </div>
            )}
          </Card>
        </div>

        <Card title="What it measures" description={preview?.ok ? "Updates as you type; nothing is saved until you press Save." : undefined} className="lg:sticky lg:top-32">
          {preview === null ? (
            <p className="py-10 text-center text-sm text-ink-muted">Enter the readings to see the fitted flex.</p>
          ) : !preview.ok ? (
            <Alert tone={mode === "csv" ? "danger" : "info"}>{preview.message.replace(/^./, (c) => c.toUpperCase())}</Alert>
          ) : (
            <BenchResult fit={preview.fit} readings={preview.readings} units={units0} alertPercent={detail.flexAlertPercent} compact />
          )}
          {serverError && (
            <Alert tone="danger" title="Not saved" className="mt-4">
              {serverError}
            </Alert>
          )}
          <div className="mt-5 flex justify-end gap-2 border-t border-line pt-4">
            <Button variant="secondary" onClick={() => navigate(`/sticks/${stickId}`)}>
              Cancel
            </Button>
            <Button onClick={submit} disabled={!canSave} loading={save.isPending}>
              Save bench test
            </Button>
          </div>
        </Card>
      </div>
    </>
  );
}
