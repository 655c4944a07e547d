import { useState } from "react";
import { Button, Card, Field, Input, toast } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { useUpdateStickSettings } from "../api/updateSettings";

/** Team admin only: the share of its rating below which a stick gets a notice. */
export function AlertLevelCard({ teamId, current }: { teamId: string; current: number }) {
  const [value, setValue] = useState(String(current));
  const [error, setError] = useState<string>();
  const update = useUpdateStickSettings(teamId);
  const save = () => {
    setError(undefined);
    update.mutate(
      { flexAlertPercent: Number(value) },
      {
        onSuccess: (s) => toast.success(`Sticks below ${s.flexAlertPercent} % of their rating now get a notice.`, "Alert level saved"),
        onError: (e) => setError(errorMessage(e)),
      },
    );
  };
  return (
    <Card title="Soft-stick alert" description="Used sticks measure softer than their rating. Flag a stick when its latest bench test falls below:">
      <div className="flex items-end gap-3">
        <Field label="% of rated flex" error={error} className="w-36">
          <Input type="number" min={50} max={100} step={1} value={value} onChange={(e) => setValue(e.target.value)} />
        </Field>
        <Button variant="secondary" onClick={save} loading={update.isPending} disabled={Number(value) === current}>
          Save
        </Button>
      </div>
    </Card>
  );
}
