import { Badge, type BadgeTone } from "@/components/ui";
import { formatDate } from "@/lib/format";
import type { AuditEntry } from "../api/auditLog";
import { describeAudit, type AuditGroup } from "../describe";

const tone: Record<AuditGroup, BadgeTone> = { people: "accent", deletions: "danger", shares: "ok", moves: "gold", plan: "warn" };
const word: Record<AuditGroup, string> = { people: "Members", deletions: "Deleted", shares: "Shared", moves: "Moved", plan: "Plan" };
const timeFmt = new Intl.DateTimeFormat(undefined, { hour: "2-digit", minute: "2-digit" });

/** Entries by day, newest first; each reads "Who did what". */
export function AuditTimeline({ entries, names }: { entries: AuditEntry[]; names: ReadonlyMap<string, string> }) {
  const days = new Map<string, AuditEntry[]>();
  for (const e of entries) {
    const day = e.createdAt.slice(0, 10);
    days.set(day, [...(days.get(day) ?? []), e]);
  }
  return (
    <ol className="flex flex-col gap-6" aria-label="Audit log entries">
      {[...days].map(([day, list]) => (
        <li key={day}>
          <h2 className="mb-2 text-xs font-semibold tracking-wide text-ink-muted uppercase">{formatDate(list[0].createdAt)}</h2>
          <ul className="divide-y divide-line rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)]">
            {list.map((e) => {
              const d = describeAudit(e, names);
              return (
                <li key={e.id} className="flex items-start gap-4 px-5 py-3 text-sm">
                  <time dateTime={e.createdAt} className="w-16 shrink-0 pt-0.5 whitespace-nowrap text-ink-muted tabular-nums">
                    {timeFmt.format(new Date(e.createdAt))}
                  </time>
                  <p className="min-w-0 flex-1 text-ink">
                    <span className="font-semibold">{d.actor}</span> {d.text}.
                  </p>
                  <Badge tone={tone[d.group]} className="shrink-0">
                    {word[d.group]}
                  </Badge>
                </li>
              );
            })}
          </ul>
        </li>
      ))}
    </ol>
  );
}
