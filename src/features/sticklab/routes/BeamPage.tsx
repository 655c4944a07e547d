import { useState } from "react";
import { useSearchParams } from "react-router-dom";
import { BEAM_MODEL_NOTICE, StickLabInputError, beamInputProblem, solveBeam, type BeamInput, type BeamResult } from "@shared/mechanics/sticklab";
import { lbfToN, nToLbf } from "@shared/units";
import type { StickDetail } from "@shared/schemas/sticks";
import { stiffnessInForce } from "@shared/mechanics/stiffness-in-force";
import { Alert, Button, Card, Field, Input, PageHeader, Select, Spinner } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { useUnits } from "@/lib/units";
import { useShotBeam } from "../api/shotBeam";
import { BeamDiagrams } from "../components/BeamDiagrams";
import { BackToStick, StickLoadState } from "../components/StickLoadState";
import { useStickRoute } from "../components/useStickRoute";
import { lengthFromMm, lengthToMm } from "../lib/bench-units";
import { formatDay, formatFlex, formatNumber, todayIso } from "../lib/format";

export function Component() {
  const { teamId, stickId, stick } = useStickRoute();
  if (!stick.data) return <StickLoadState query={stick} />;
  return <BeamModel key={stickId} teamId={teamId} detail={stick.data} />;
}

interface LoadRow {
  name: string;
  x: string;
  force: string;
}
interface Manual {
  length: string;
  supports: [string, string];
  supportNames: [string, string];
  loads: LoadRow[];
  ei: string;
  axisFrom: string;
}

type Preset = "bench" | "hands";

/** The stick's stiffness in force today (the one rule: its latest bench test by now, else its rating). */
function stickEi(detail: StickDetail): { eiNm2: number; from: string } | null {
  const latest = detail.stick.latest;
  const k = stiffnessInForce({ ratedFlex: detail.stick.ratedFlex, tests: latest ? [latest] : [] }, todayIso());
  if (!k) return null;
  return { eiNm2: k.eiNm2, from: k.source === "bench" ? `bench test of ${formatDay(k.testedOn!)} (${formatFlex(k.flex)} flex)` : `rated ${k.flex} flex (no bench test yet)` };
}

function presetInput(preset: Preset, detail: StickDetail): BeamInput & { supportNames: [string, string]; loadNames: string[]; axisFrom: string } {
  const L = detail.stick.lengthMm ?? 1500;
  const ei = stickEi(detail)?.eiNm2;
  if (preset === "bench") {
    // The rating's own test: 1 m span centred on the stick, the load that bends the shaft 1 in.
    const flex = detail.stick.latest?.measuredFlex ?? detail.stick.ratedFlex ?? 85;
    const span = Math.min(1000, L - 20);
    return {
      lengthMm: L, supportsMm: [(L - span) / 2, (L + span) / 2], loads: [{ xMm: L / 2, forceN: lbfToN(flex) }], eiNm2: ei,
      supportNames: ["Support", "Support"], loadNames: ["Bench weight"], axisFrom: "from the butt end",
    };
  }
  // An example hold to start from: change the numbers to the player's own.
  return {
    lengthMm: L, supportsMm: [80, L - 40], loads: [{ xMm: Math.round(L * 0.42), forceN: 250 }], eiNm2: ei,
    supportNames: ["Top hand", "Blade heel"], loadNames: ["Bottom hand"], axisFrom: "from the butt end",
  };
}

export function BeamModel({ teamId, detail }: { teamId: string; detail: StickDetail }) {
  const { system, unit, format } = useUnits();
  const [params, setParams] = useSearchParams();
  const shotId = params.get("shot");
  const shotBeam = useShotBeam(teamId, shotId);
  const usableShots = detail.shots.filter((s) => s.hasDeflection);
  const lengthDigits = system === "imperial" ? 1 : 0;

  const toManual = (b: ReturnType<typeof presetInput>): Manual => ({
    length: formatNumber(lengthFromMm(system, b.lengthMm), lengthDigits).replace(/,/g, ""),
    supports: b.supportsMm.map((s) => formatNumber(lengthFromMm(system, s), lengthDigits).replace(/,/g, "")) as [string, string],
    supportNames: b.supportNames,
    loads: b.loads.map((l, i) => ({
      name: b.loadNames[i] ?? `Load ${i + 1}`,
      x: formatNumber(lengthFromMm(system, l.xMm), lengthDigits).replace(/,/g, ""),
      force: formatNumber(system === "imperial" ? nToLbf(l.forceN) : l.forceN, 0).replace(/,/g, ""),
    })),
    ei: b.eiNm2 === undefined ? "" : formatNumber(b.eiNm2, 1).replace(/,/g, ""),
    axisFrom: b.axisFrom,
  });
  const [manual, setManual] = useState<Manual>(() => toManual(presetInput("bench", detail)));
  const [preset, setPreset] = useState<Preset | "custom">("bench");

  const choose = (value: string) => {
    if (value.startsWith("shot:")) return setParams({ shot: value.slice(5) });
    setParams({});
    if (value === "bench" || value === "hands") {
      setPreset(value);
      setManual(toManual(presetInput(value, detail)));
    }
  };

  const editShot = () => {
    const s = shotBeam.data;
    if (!s) return;
    setManual(toManual({ ...s.beam.input, supportNames: ["Top hand", "Blade heel"], loadNames: ["Bottom hand"], axisFrom: "from the top hand" }));
    setPreset("custom");
    setParams({});
  };

  const forceToN = (v: number) => (system === "imperial" ? lbfToN(v) : v);
  const manualInput: BeamInput = {
    lengthMm: lengthToMm(system, Number(manual.length)),
    supportsMm: manual.supports.map((s) => lengthToMm(system, Number(s))) as [number, number],
    loads: manual.loads.map((l) => ({ xMm: lengthToMm(system, Number(l.x)), forceN: forceToN(Number(l.force)) })),
    ...(manual.ei.trim() !== "" ? { eiNm2: Number(manual.ei) } : {}),
  };
  const solved = solveManual(manualInput);

  const fromShot = shotId !== null;
  const shown = fromShot
    ? shotBeam.data && { input: shotBeam.data.beam.input, result: shotBeam.data.result, supportNames: ["Top hand", "Blade heel"] as [string, string], loadNames: ["Bottom hand"], axisFrom: "from the top hand" }
    : "result" in solved && { ...solved, supportNames: manual.supportNames, loadNames: manual.loads.map((l) => l.name), axisFrom: manual.axisFrom };
  const ei = stickEi(detail);
  const setLoad = (i: number, patch: Partial<LoadRow>) => {
    setPreset("custom");
    setManual({ ...manual, loads: manual.loads.map((l, j) => (j === i ? { ...l, ...patch } : l)) });
  };
  const edit = (patch: Partial<Manual>) => {
    setPreset("custom");
    setManual({ ...manual, ...patch });
  };

  return (
    <>
      <PageHeader
        eyebrow={<BackToStick to={`/sticks/${detail.stick.id}`} label={detail.stick.label} />}
        title="Beam model"
        description="The shaft as a beam on two supports with point loads: where it carries the most bending, and so where it is most likely to break."
      />
      <Alert tone="info" className="mb-6">
        <strong>Estimates for coaching.</strong> {BEAM_MODEL_NOTICE}
      </Alert>

      <div className="grid items-start gap-6 xl:grid-cols-[22rem_minmax(0,1fr)]">
        <Card title="Loads on the shaft">
          <div className="flex flex-col gap-4">
            <Field label="Start from">
              <Select value={fromShot ? `shot:${shotId}` : preset} onChange={(e) => choose(e.target.value)}>
                <option value="bench">The bench test set-up</option>
                <option value="hands">An example hold: hands and blade</option>
                {preset === "custom" && !fromShot && <option value="custom">My own numbers</option>}
                {usableShots.length > 0 && (
                  <optgroup label="A digitised shot with this stick">
                    {usableShots.map((s) => (
                      <option key={s.id} value={`shot:${s.id}`}>
                        {s.label || "Shot"} · {formatDay(s.date)}
                        {s.player ? ` · ${s.player.name}` : ""}
                      </option>
                    ))}
                  </optgroup>
                )}
                {fromShot && !usableShots.some((s) => s.id === shotId) && <option value={`shot:${shotId}`}>The shot in the link</option>}
              </Select>
            </Field>
            {usableShots.length === 0 && (
              <p className="-mt-2 text-xs text-ink-muted">
                {detail.shots.length === 0
                  ? "No shots are linked to this stick yet."
                  : `${detail.shots.length} shot${detail.shots.length === 1 ? " is" : "s are"} linked to this stick, but none has a shaft deflection yet (mark top hand, bottom hand and blade heel at peak bend).`}
              </p>
            )}

            {fromShot ? (
              <ShotSummary query={shotBeam} onEdit={editShot} />
            ) : (
              <>
                <div className="grid grid-cols-3 gap-3">
                  <Field label={`Stick (${unit("length")})`}>
                    <Input inputMode="decimal" value={manual.length} onChange={(e) => edit({ length: e.target.value })} />
                  </Field>
                  <Field label={manual.supportNames[0] === manual.supportNames[1] ? "Support 1" : manual.supportNames[0]}>
                    <Input inputMode="decimal" value={manual.supports[0]} onChange={(e) => edit({ supports: [e.target.value, manual.supports[1]] })} />
                  </Field>
                  <Field label={manual.supportNames[0] === manual.supportNames[1] ? "Support 2" : manual.supportNames[1]}>
                    <Input inputMode="decimal" value={manual.supports[1]} onChange={(e) => edit({ supports: [manual.supports[0], e.target.value] })} />
                  </Field>
                </div>
                <p className="-mt-2 text-xs text-ink-muted">Positions {manual.axisFrom}, in {unit("length")}.</p>
                <div className="flex flex-col gap-2">
                  <p className="text-sm font-medium text-ink">Loads</p>
                  {manual.loads.map((l, i) => (
                    <div key={i} className="rounded-lg border border-line p-2.5">
                      <div className="flex items-center gap-2">
                        <Input aria-label={`Name of load ${i + 1}`} className="h-8 text-sm font-medium" value={l.name} onChange={(e) => setLoad(i, { name: e.target.value })} />
                        <Button variant="ghost" size="sm" aria-label={`Remove load ${i + 1}`} disabled={manual.loads.length <= 1} onClick={() => edit({ loads: manual.loads.filter((_, j) => j !== i) })}>
                          ✕
                        </Button>
                      </div>
                      <div className="mt-2 grid grid-cols-2 gap-2 text-xs text-ink-muted">
                        <label className="flex flex-col gap-1">
                          At ({unit("length")})
                          <Input aria-label={`Position of load ${i + 1}`} className="text-[0.95rem]" inputMode="decimal" value={l.x} onChange={(e) => setLoad(i, { x: e.target.value })} />
                        </label>
                        <label className="flex flex-col gap-1">
                          Force ({unit("force")})
                          <Input aria-label={`Force of load ${i + 1}`} className="text-[0.95rem]" inputMode="decimal" value={l.force} onChange={(e) => setLoad(i, { force: e.target.value })} />
                        </label>
                      </div>
                    </div>
                  ))}
                  <Button
                    variant="secondary"
                    size="sm"
                    className="self-start"
                    onClick={() => edit({ loads: [...manual.loads, { name: `Load ${manual.loads.length + 1}`, x: manual.supports[1], force: "0" }] })}
                  >
                    Add load
                  </Button>
                </div>
                <Field label="Shaft stiffness EI (N·m²)" hint={ei ? `From the ${ei.from}: ${formatNumber(ei.eiNm2, 1)}. Empty: no deflected shape.` : "No bench test or rating: enter one for the deflected shape."}>
                  <Input inputMode="decimal" value={manual.ei} onChange={(e) => edit({ ei: e.target.value })} />
                </Field>
                {"error" in solved && <Alert tone="danger">{solved.error.replace(/^./, (c) => c.toUpperCase())}</Alert>}
              </>
            )}
          </div>
        </Card>

        <Card title="Shear, bending moment and deflection along the shaft" description="Drawn to scale along the shaft. Move the pointer over the diagrams to read any point.">
          {shown ? (
            <div className="flex flex-col gap-4">
              <BreakPointSummary result={shown.result} axisFrom={shown.axisFrom} format={format} />
              <BeamDiagrams input={shown.input} result={shown.result} system={system} axisFrom={shown.axisFrom} supportNames={shown.supportNames} loadNames={shown.loadNames} />
            </div>
          ) : fromShot && shotBeam.isPending ? (
            <div className="py-16 text-center">
              <Spinner label="Building the beam from the shot…" showLabel />
            </div>
          ) : (
            <p className="py-16 text-center text-sm text-ink-muted">Fix the numbers on the left to see the diagrams.</p>
          )}
        </Card>
      </div>
    </>
  );
}

/** Solving takes well under a millisecond, so the diagrams follow every keystroke. */
function solveManual(input: BeamInput): { input: BeamInput; result: BeamResult } | { error: string } {
  const problem = beamInputProblem(input);
  if (problem) return { error: problem };
  try {
    return { input, result: solveBeam(input) };
  } catch (e) {
    return { error: e instanceof StickLabInputError ? e.message : String(e) };
  }
}

type Format = ReturnType<typeof useUnits>["format"];

function BreakPointSummary({ result, axisFrom, format }: { result: BeamResult; axisFrom: string; format: Format }) {
  const { system } = useUnits();
  const pos = system === "imperial" ? 1 : 0;
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-3 rounded-lg bg-sunken/60 px-4 py-3 sm:grid-cols-4">
      <div className="col-span-2">
        <dt className="text-xs font-medium tracking-wide text-danger uppercase">Predicted break point</dt>
        <dd className="text-lg font-semibold text-ink tabular-nums" data-testid="break-point-summary">
          {format("length", result.maxMoment.xMm, { digits: pos })} {axisFrom}
        </dd>
        <dd className="text-sm text-ink-muted">where the bending moment is largest: {format("moment", Math.abs(result.maxMoment.valueNm))}</dd>
      </div>
      <div>
        <dt className="text-xs font-medium tracking-wide text-ink-muted uppercase">Supports hold</dt>
        <dd className="text-sm font-medium text-ink tabular-nums">
          {format("force", result.reactionsN[0])} and {format("force", result.reactionsN[1])}
        </dd>
      </div>
      <div>
        <dt className="text-xs font-medium tracking-wide text-ink-muted uppercase">Largest bend</dt>
        <dd className="text-sm font-medium text-ink tabular-nums">
          {result.maxDeflectionMm !== undefined ? `${format("length", Math.abs(result.maxDeflectionMm))} at ${format("length", result.maxDeflectionXMm!, { digits: pos })}` : "needs EI"}
        </dd>
      </div>
    </dl>
  );
}

function ShotSummary({ query, onEdit }: { query: ReturnType<typeof useShotBeam>; onEdit: () => void }) {
  const { format } = useUnits();
  if (query.isPending) return <Spinner label="Loading the shot…" showLabel />;
  if (query.isError)
    return (
      <Alert tone="warn" title="This shot can't start a beam yet">
        {errorMessage(query.error)}
      </Alert>
    );
  const { shot, beam, stiffness } = query.data;
  return (
    <div className="flex flex-col gap-3 text-sm">
      <p className="text-ink">
        <strong>{shot.label || "Shot"}</strong> of {formatDay(shot.date)}, at peak bend (frame {shot.frame}).
      </p>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2">
        <dt className="text-ink-muted">Top hand → bottom hand</dt>
        <dd className="tabular-nums">{format("length", beam.aMm, { digits: 0 })}</dd>
        <dt className="text-ink-muted">Bottom hand → blade heel</dt>
        <dd className="tabular-nums">{format("length", beam.bMm, { digits: 0 })}</dd>
        <dt className="text-ink-muted">Shaft deflection</dt>
        <dd className="tabular-nums">{format("length", beam.deflectionMm)}</dd>
        <dt className="text-ink-muted">Stiffness (EI)</dt>
        <dd className="tabular-nums">
          {formatNumber(stiffness.eiNm2, 0)} N·m² <span className="text-ink-muted">({stiffness.source === "bench" ? `bench ${formatDay(stiffness.testedOn)}` : "from the rating"})</span>
        </dd>
        <dt className="text-ink-muted">Bottom hand's push</dt>
        <dd className="font-semibold tabular-nums">{format("force", beam.forceN)}</dd>
      </dl>
      <p className="text-xs text-ink-muted">The push is the force that bends a shaft of this stiffness by the shot's deflection at the bottom hand.</p>
      <Button variant="secondary" size="sm" className="self-start" onClick={onEdit}>
        Change these numbers
      </Button>
    </div>
  );
}
