import { useState } from "react";
import { useNavigate } from "react-router-dom";
import type { BenchTestRow, StickDetail } from "@shared/schemas/sticks";
import { Button, ButtonLink, Card, ConfirmDialog, EmptyState, PageHeader, Table, TBody, Td, Th, THead, Tr, toast } from "@/components/ui";
import { useDeleteBenchTest } from "../api/deleteBenchTest";
import { BenchResult } from "../components/BenchResult";
import { BackToStick, StickLoadState } from "../components/StickLoadState";
import { useStickRoute } from "../components/useStickRoute";
import { benchUnits, deflectionFromMm, loadFromN, type BenchUnits } from "../lib/bench-units";
import { formatDay, formatNumber } from "../lib/format";

export function Component() {
  const { teamId, stickId, testId, stick } = useStickRoute();
  if (!stick.data) return <StickLoadState query={stick} />;
  const test = stick.data.benchTests.find((t) => t.id === testId);
  if (!test)
    return (
      <EmptyState title="That bench test isn't here" action={<ButtonLink to={`/sticks/${stickId}`}>Back to the stick</ButtonLink>}>
        It may have been removed.
      </EmptyState>
    );
  return <BenchTestView teamId={teamId} detail={stick.data} test={test} />;
}

function BenchTestView({ teamId, detail, test }: { teamId: string; detail: StickDetail; test: BenchTestRow }) {
  const navigate = useNavigate();
  const [removing, setRemoving] = useState(false);
  const remove = useDeleteBenchTest(teamId, detail.stick.id);
  // A bench test is a record of what was measured: shown in the units it was read in.
  const units: BenchUnits = test.entry.loadUnit === "lbf" ? "imperial" : "metric";
  const u = benchUnits[units];
  const entered = test.entry.source === "csv" ? `uploaded from ${test.entry.fileName ?? "a CSV file"}` : "typed in";

  return (
    <>
      <PageHeader
        eyebrow={<BackToStick to={`/sticks/${detail.stick.id}`} label={detail.stick.label} />}
        title={`Bench test of ${formatDay(test.testedOn)}`}
        description={`${test.readings.length} readings ${entered} in ${benchUnits[units].label}${test.createdBy ? ` by ${test.createdBy.name}` : ""}, and shown that way.`}
        actions={
          <>
            <ButtonLink to={`/sticks/${detail.stick.id}/beam`}>Beam model</ButtonLink>
            {detail.canEdit && (
              <Button variant="ghost-danger" onClick={() => setRemoving(true)}>
                Delete test
              </Button>
            )}
          </>
        }
      />
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_18rem]">
        <Card>
          <BenchResult fit={test.fit} readings={test.readings} units={units} alertPercent={detail.flexAlertPercent} />
        </Card>
        <Card title="Readings" flush>
          <Table caption="Readings" cards={false}>
            <THead>
              <Tr>
                <Th>#</Th>
                <Th className="text-right">Load ({u.load})</Th>
                <Th className="text-right">Deflection ({u.deflection})</Th>
              </Tr>
            </THead>
            <TBody>
              {test.readings.map((r, i) => (
                <Tr key={i}>
                  <Td className="text-ink-muted">{i + 1}</Td>
                  <Td className="text-right tabular-nums">{formatNumber(loadFromN(units, r.loadN), 1)}</Td>
                  <Td className="text-right tabular-nums">{formatNumber(deflectionFromMm(units, r.deflectionMm), units === "imperial" ? 3 : 2)}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </Card>
      </div>
      <ConfirmDialog
        open={removing}
        title="Delete this bench test?"
        description="The stick's history and its shots' stored energy will no longer use it. This cannot be undone."
        confirmLabel="Delete test"
        pending={remove.isPending}
        onCancel={() => setRemoving(false)}
        onConfirm={() =>
          remove.mutate(test.id, {
            onSuccess: () => {
              toast.success("The bench test was deleted.", "Deleted");
              navigate(`/sticks/${detail.stick.id}`);
            },
            onSettled: () => setRemoving(false),
          })
        }
      />
    </>
  );
}
