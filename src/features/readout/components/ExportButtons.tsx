import { useState } from "react";
import { Button, toast } from "@/components/ui";
import { downloadFile } from "@/components/shot/download";
import { errorMessage } from "@/lib/api";
import type { UnitSystem } from "@shared/units";
import { exportUrl, type ExportKind } from "../api/exports";

const items: { kind: ExportKind; label: string; needsResults: boolean }[] = [
  { kind: "report.pdf", label: "PDF report", needsResults: true },
  { kind: "results.csv", label: "Results CSV", needsResults: true },
  { kind: "marks.csv", label: "Marks CSV", needsResults: false },
];

/** Downloads in the viewer's units; the PDF is the one-page report to show a coach. */
export function ExportButtons({ teamId, shotId, units, hasResults }: { teamId: string; shotId: string; units: UnitSystem; hasResults: boolean }) {
  const [busy, setBusy] = useState<ExportKind | null>(null);
  const run = async (kind: ExportKind) => {
    setBusy(kind);
    try {
      await downloadFile(exportUrl(teamId, shotId, kind, units), `shot-${kind.replace(".", "-")}`);
    } catch (e) {
      toast.error(errorMessage(e), "Couldn't download");
    } finally {
      setBusy(null);
    }
  };
  return (
    <div className="flex flex-wrap gap-2" role="group" aria-label="Downloads">
      {items.map((i) => (
        <Button
          key={i.kind}
          variant={i.kind === "report.pdf" ? "primary" : "secondary"}
          size="sm"
          loading={busy === i.kind}
          disabled={(i.needsResults && !hasResults) || (busy !== null && busy !== i.kind)}
          title={i.needsResults && !hasResults ? "Available once the shot has results" : undefined}
          onClick={() => void run(i.kind)}
        >
          {i.label}
        </Button>
      ))}
    </div>
  );
}
