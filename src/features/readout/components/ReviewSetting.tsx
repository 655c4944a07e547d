import { useState } from "react";
import { toast } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { useReviewSettings, useUpdateReviewSettings } from "../api/reviewSettings";

/** How the team's shots reach players: after a coach's review (default), or as soon as results exist. Team admins change it. */
export function ReviewSetting({ teamId, canChange }: { teamId: string; canChange: boolean }) {
  const q = useReviewSettings(teamId);
  const update = useUpdateReviewSettings(teamId);
  // The box shows the choice in the same render as the click (the mutation's pending state arrives
  // a tick later, and a controlled box would flip back meanwhile); the server's answer confirms it.
  const [chosen, setChosen] = useState<boolean | null>(null);
  if (!q.data) return null;
  const auto = chosen ?? q.data.autoPublish;
  const set = (autoPublish: boolean) => {
    setChosen(autoPublish);
    update.mutateAsync({ autoPublish }).then(
      () => toast.success(autoPublish ? "Shots with results now reach their players by themselves." : "New results now wait for a coach to publish them.", "Review setting saved"),
      (e) => toast.error(errorMessage(e), "Not saved"),
    ).finally(() => setChosen(null));
  };
  return (
    <div className="mb-4 flex flex-wrap items-center gap-x-4 gap-y-2 rounded-lg border border-line bg-surface px-4 py-2.5 text-sm" data-testid="review-setting">
      <span className="flex-[1_1_16rem] text-ink-muted">
        {auto ? "Shots reach their players as soon as they have results (no review step)." : "New results wait for a coach to review and publish them before players see them."}
      </span>
      {canChange && (
        <label className="flex items-center gap-2 text-ink">
          <input type="checkbox" className="size-4 accent-accent" checked={auto} onChange={(e) => set(e.target.checked)} />
          Publish results automatically
        </label>
      )}
    </div>
  );
}
