import { useMemo, useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { Alert, EmptyState, PageHeader, PageSpinner } from "@/components/ui";
import { shotColors } from "@/components/shot/colors";
import { useTeamFromLink } from "@/components/shot/useTeamFromLink";
import { errorMessage } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { isStaff } from "@/lib/roles";
import { useActiveTeam } from "@/lib/session";
import { useUnits } from "@/lib/units";
import { shotTypeLabels } from "@shared/schemas/clips";
import { shotTitle, type ShotReadout } from "@shared/schemas/readout";
import { useCompare } from "../api/compare";
import { useShotChoices } from "../api/shotChoices";
import { DifferencesTable } from "../components/DifferencesTable";
import { OverlaidCharts } from "../components/OverlaidCharts";
import { ShotPicker } from "../components/ShotPicker";
import { SyncedFrames } from "../components/SyncedFrames";
import { Verdicts } from "../components/Verdicts";
import { differences, type Side } from "../lib/differences";
import { stepNearest, stepTimeMs, syncPlan, type ClipClock } from "../lib/sync";

const NAMES: Record<Side, string> = { a: "Shot A", b: "Shot B" };
const COLORS: Record<Side, string> = { a: shotColors.a, b: shotColors.b };

/** /compare?a=&b= — two shots synced at puck strike, their charts overlaid and their differences in words. */
export function Component() {
  const team = useActiveTeam();
  const switching = useTeamFromLink();
  const [search, setSearch] = useSearchParams();
  const a = search.get("a") ?? "";
  const b = search.get("b") ?? "";
  const { system } = useUnits();
  const choices = useShotChoices(team?.id ?? "");
  const q = useCompare(team?.id ?? "", a, b, !!team && !switching && !!a && !!b);
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, your team's shots show here.</EmptyState>;
  const staff = isStaff(team.role);
  const pick = (x: string, y: string) => setSearch({ a: x, b: y });
  const picker =
    choices.data && choices.data.shots.length >= 2 ? (
      <ShotPicker key={`${a}-${b}`} shots={choices.data.shots} a={a} b={b} units={system} staff={staff} onCompare={pick} />
    ) : choices.data ? (
      <EmptyState title="Two shots are needed">
        {staff
          ? "Side by side needs two digitised shots. Upload clips in Clips and digitise a shot in each; they appear here."
          : "Side by side needs two of your shots. When your analyst has digitised two of them, pick them here."}
      </EmptyState>
    ) : null;

  const header = <PageHeader eyebrow={team.name} title="Side by side" description="Two shots synced at puck strike, stepping together in time, with the differences in plain words." />;
  if (!a || !b)
    return (
      <>
        {header}
        {choices.isPending ? <PageSpinner label="Loading shots…" /> : choices.isError ? <Alert tone="danger">{errorMessage(choices.error)}</Alert> : picker}
      </>
    );
  if (switching || q.isPending) return <>{header}<PageSpinner label="Loading both shots…" /></>;
  if (q.isError)
    return (
      <>
        {header}
        <Alert tone="danger" title="Can't put these two side by side" className="mb-6">
          {errorMessage(q.error)}
        </Alert>
        {picker}
      </>
    );
  return (
    <>
      {header}
      <Comparison teamId={team.id} shots={q.data} />
      <div className="mt-8">{picker}</div>
    </>
  );
}

function clockOf(r: ShotReadout): ClipClock | null {
  const strike = r.events.find((e) => e.key === "puckStrike")?.frame;
  if (strike === undefined) return null;
  return { fps: r.clip.captureFps, times: r.frameTimes, strike, first: r.shot.frameStart, last: r.shot.frameEnd };
}

/** Two shots of different kinds, or filmed at different rates, are compared with care: say so plainly. */
function Mismatch({ shots }: { shots: Record<Side, ShotReadout> }) {
  const [a, b] = [shots.a, shots.b];
  const fps = (r: ShotReadout) => `${r.clip.captureFps.toLocaleString("en")} fps`;
  const lines: string[] = [];
  if (a.shot.shotType !== b.shot.shotType)
    lines.push(
      `${NAMES.a} is a ${shotTypeLabels[a.shot.shotType].toLowerCase()} and ${NAMES.b} a ${shotTypeLabels[b.shot.shotType].toLowerCase()}. Different shots load and release the stick differently, so their numbers differ for that reason too.`,
    );
  if (a.clip.captureFps !== b.clip.captureFps) {
    const slow = a.clip.captureFps < b.clip.captureFps ? "a" : "b";
    lines.push(
      `The clips were filmed at different rates: ${NAMES.a} at ${fps(a)}, ${NAMES.b} at ${fps(b)}. They stay in step by time, so ${NAMES[slow]} moves in bigger jumps and its times are only as fine as one of its frames (${(1000 / shots[slow].clip.captureFps).toFixed(2)} ms).`,
    );
  }
  if (!lines.length) return null;
  return (
    <div data-testid="compare-mismatch">
      <Alert tone="warn" title="These two shots are not alike">
        <ul className="list-disc space-y-1 pl-5">
          {lines.map((l) => (
            <li key={l}>{l}</li>
          ))}
        </ul>
      </Alert>
    </div>
  );
}

function Comparison({ teamId, shots }: { teamId: string; shots: Record<Side, ShotReadout> }) {
  const { system } = useUnits();
  const [step, setStep] = useState(0);
  const clocks = useMemo(() => ({ a: clockOf(shots.a), b: clockOf(shots.b) }), [shots]);
  const plan = useMemo(() => (clocks.a && clocks.b ? syncPlan(clocks.a, clocks.b) : null), [clocks]);
  const diffs = differences(shots.a.results, shots.b.results, system, NAMES);
  const missing = (["a", "b"] as const).filter((s) => !shots[s].results);
  return (
    <div className="flex flex-col gap-6">
      <ul className="grid grid-cols-1 gap-3 md:grid-cols-2">
        {(["a", "b"] as const).map((s) => (
          <li key={s} className="flex items-center gap-3 rounded-lg border border-line bg-surface px-4 py-3" style={{ borderLeft: `6px solid ${COLORS[s]}` }}>
            <span className="shrink-0 text-lg font-semibold whitespace-nowrap" style={{ color: COLORS[s] }}>
              {NAMES[s]}
            </span>
            <span className="min-w-0">
              <Link to={`/readout/${shots[s].shot.id}`} className="block truncate font-medium text-ink hover:underline">
                {shotTitle(shots[s].shot)}
              </Link>
              <span className="block truncate text-sm text-ink-muted">
                {[shots[s].shot.playerName, formatDate(shots[s].shot.date), shots[s].shot.stickLabel, `${shots[s].clip.captureFps.toLocaleString()} fps`].filter(Boolean).join(" · ")}
              </span>
            </span>
          </li>
        ))}
      </ul>
      <Mismatch shots={shots} />
      {missing.map((s) => (
        <Alert key={s} tone="warn" title={`${NAMES[s]} has no results yet`}>
          {shots[s].missing}
        </Alert>
      ))}
      <Verdicts diffs={diffs} names={NAMES} colors={COLORS} />
      {plan && clocks.a && clocks.b ? (
        <SyncedFrames teamId={teamId} shots={shots} clocks={{ a: clocks.a, b: clocks.b }} plan={plan} names={NAMES} colors={COLORS} step={step} onStep={setStep} />
      ) : (
        <Alert tone="info">The clips sync at puck strike: set the puck strike event on both shots to step them together.</Alert>
      )}
      <OverlaidCharts shots={shots} names={NAMES} colors={COLORS} units={system} cursorT={plan ? stepTimeMs(plan, step) : 0} onPickTime={(t) => plan && setStep(stepNearest(plan, t))} />
      <DifferencesTable diffs={diffs} names={NAMES} colors={COLORS} units={system} />
    </div>
  );
}
