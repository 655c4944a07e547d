import { cn } from "@/lib/cn";
import type { AutosaveStatus } from "../model/autosave";
import type { CalibrationStatus } from "../model/calibration-save";

type Shown = { tone: "ok" | "busy" | "warn" | "bad"; text: string; title: string };

/** One word for the state of everything this page saves: saved, saving, offline, conflict. */
export function describeSave(marks: AutosaveStatus | null, cal: CalibrationStatus): Shown {
  if (!marks) return { tone: "ok", text: "Read-only", title: "You can look, step and zoom; an analyst or coach edits this shot." };
  if (marks.kind === "conflict") return { tone: "bad", text: "Not saved: conflict", title: "Someone else saved this shot; choose below what to keep." };
  if (marks.kind === "error") return { tone: "bad", text: "Not saved", title: marks.message };
  if (cal.kind === "error") return { tone: "bad", text: "Calibration not saved", title: cal.message };
  if (marks.kind === "offline" || cal.kind === "offline")
    return { tone: "warn", text: "Offline — kept on this computer", title: "The server cannot be reached. Every edit is kept in this browser and sent when it is back." };
  if (marks.kind === "saving" || marks.kind === "pending" || cal.kind === "saving") return { tone: "busy", text: "Saving…", title: "Sending your latest edits." };
  return { tone: "ok", text: `Saved · v${marks.version}`, title: `Every edit is on the server (version ${marks.version}).` };
}

export function SaveIndicator({ marks, cal }: { marks: AutosaveStatus | null; cal: CalibrationStatus }) {
  const d = describeSave(marks, cal);
  return (
    <span
      data-testid="save-indicator"
      data-state={marks?.kind ?? "readonly"}
      title={d.title}
      role="status"
      className={cn(
        "inline-flex h-8 items-center gap-2 rounded-full px-3 text-sm font-medium ring-1 ring-inset",
        d.tone === "ok" && "bg-ok-soft text-ok ring-ok/25",
        d.tone === "busy" && "bg-accent-soft text-accent-strong ring-accent/25",
        d.tone === "warn" && "bg-warn-soft text-warn ring-warn/30",
        d.tone === "bad" && "bg-danger-soft text-danger ring-danger/30",
      )}
    >
      <span className={cn("size-2 rounded-full bg-current", d.tone === "busy" && "animate-pulse")} aria-hidden />
      {d.text}
    </span>
  );
}
