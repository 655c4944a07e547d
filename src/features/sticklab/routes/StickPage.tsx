import { useState } from "react";
import { useNavigate } from "react-router-dom";
import type { StickDetail } from "@shared/schemas/sticks";
import { Alert, Button, ButtonLink, Card, ConfirmDialog, PageHeader, toast } from "@/components/ui";
import { useUnits } from "@/lib/units";
import { useDeleteStick } from "../api/deleteStick";
import { useSticks } from "../api/sticks";
import { BenchTestsTable } from "../components/BenchTestsTable";
import { HistoryChart } from "../components/HistoryChart";
import { BackToStick, StickLoadState } from "../components/StickLoadState";
import { StickFormDialog } from "../components/StickFormDialog";
import { useStickRoute } from "../components/useStickRoute";
import { formatDay, formatFlex, formatPercent, formatRated } from "../lib/format";

export function Component() {
  const { teamId, teamName, stick } = useStickRoute();
  if (!stick.data) return <StickLoadState query={stick} />;
  return <StickView teamId={teamId} teamName={teamName} detail={stick.data} />;
}

function StickView({ teamId, teamName, detail }: { teamId: string; teamName: string; detail: StickDetail }) {
  const { stick, benchTests, flexAlertPercent: alert } = detail;
  const { format, system } = useUnits();
  const lengthDigits = system === "imperial" ? 1 : 0;
  const [editing, setEditing] = useState(false);
  const [removing, setRemoving] = useState(false);
  const navigate = useNavigate();
  const remove = useDeleteStick(teamId);
  const players = useSticks(teamId).data?.players ?? [];
  const latest = stick.latest;
  const first = benchTests[0];
  const shotsTotal = detail.shotsByDate.reduce((n, d) => n + d.count, 0);

  const summary = [stick.owner?.name ?? "Team stick", stick.ratedFlex !== null ? `rated ${formatRated(stick.ratedFlex)} flex` : "no rating", stick.lengthMm ? format("length", stick.lengthMm, { digits: lengthDigits }) : null]
    .filter(Boolean)
    .join(" · ");

  return (
    <>
      <PageHeader
        eyebrow={<BackToStick to="/sticks" label={`${teamName} · Stick lab`} />}
        title={stick.label}
        description={summary}
        actions={
          <>
            {detail.canEdit && <ButtonLink to="bench-tests/new" variant="primary">New bench test</ButtonLink>}
            <ButtonLink to="beam">Beam model</ButtonLink>
            {detail.canEdit && (
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Edit
              </Button>
            )}
          </>
        }
      />

      {stick.belowAlert && latest && (
        <Alert tone="warn" title={`Below ${alert} % of its rating`} className="mb-6">
          On {formatDay(latest.testedOn)} this stick measured {formatFlex(latest.measuredFlex)} flex, {formatPercent(latest.percentOfRated)} of its rated{" "}
          {formatRated(stick.ratedFlex)}
          {first && first.id !== latest.benchTestId && <> (it measured {formatFlex(first.fit.measuredFlex)} on {formatDay(first.testedOn)})</>}. It is now noticeably softer than
          the team's alert level: re-test it, and talk with the player about whether it still suits them.
        </Alert>
      )}

      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_19rem]">
        <div className="flex min-w-0 flex-col gap-6">
          <Card
            title="Stiffness history"
            description={
              benchTests.length > 0
                ? `Measured flex at each bench test${stick.ratedFlex ? ", against the rating and the team's alert line" : ""}${shotsTotal ? `; gold: shots taken with it each day (${shotsTotal} in all)` : ""}.`
                : undefined
            }
          >
            {benchTests.length === 0 ? (
              <p className="py-6 text-sm text-ink-muted">No bench tests yet: the history starts with the first one.</p>
            ) : (
              <HistoryChart tests={benchTests} shotsByDate={detail.shotsByDate} ratedFlex={stick.ratedFlex} alertPercent={alert} />
            )}
          </Card>
          <BenchTestsTable tests={benchTests} alertPercent={alert} />
        </div>
        <aside className="flex flex-col gap-4">
          <Card title="Details">
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
              <Detail label="Owner">{stick.owner?.name ?? "Team stick"}</Detail>
              <Detail label="Rated flex">{formatRated(stick.ratedFlex)}</Detail>
              <Detail label="Length">{stick.lengthMm ? format("length", stick.lengthMm, { digits: lengthDigits }) : "—"}</Detail>
              <Detail label="Blade curve">{stick.bladeCurve || "—"}</Detail>
              <Detail label="Lie">{stick.lie || "—"}</Detail>
              <Detail label="First used">{formatDay(stick.firstUseDate)}</Detail>
              <Detail label="Shots">{stick.shotCount}</Detail>
            </dl>
            {stick.notes && <p className="mt-3 border-t border-line pt-3 text-sm whitespace-pre-line text-ink-muted">{stick.notes}</p>}
          </Card>
          {detail.canEdit && (
            <Button variant="ghost-danger" className="self-start" onClick={() => setRemoving(true)}>
              Remove this stick
            </Button>
          )}
        </aside>
      </div>

      {detail.canEdit && <StickFormDialog teamId={teamId} open={editing} onClose={() => setEditing(false)} players={players} stick={stick} />}
      <ConfirmDialog
        open={removing}
        title={`Remove ${stick.label}?`}
        description={`Its ${benchTests.length} bench test${benchTests.length === 1 ? "" : "s"} go with it, and its shots lose their link to a stick. This cannot be undone.`}
        confirmLabel="Remove stick"
        pending={remove.isPending}
        onCancel={() => setRemoving(false)}
        onConfirm={() =>
          remove.mutate(stick.id, {
            onSuccess: () => {
              toast.success(`${stick.label} was removed.`, "Stick removed");
              navigate("/sticks");
            },
            onSettled: () => setRemoving(false),
          })
        }
      />
    </>
  );
}

function Detail({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <>
      <dt className="text-ink-muted">{label}</dt>
      <dd className="text-ink">{children}</dd>
    </>
  );
}
