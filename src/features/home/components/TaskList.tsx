import { Link } from "react-router-dom";
import type { HomeTask } from "@shared/schemas/home";

/** Staff and team admin: each waiting thing as a sentence that links to its list, with up to three of them linked one by one. */
export function TaskList({ tasks }: { tasks: HomeTask[] }) {
  if (!tasks.length)
    return (
      <p data-testid="home-all-clear" className="rounded-[var(--radius-card)] border border-line bg-surface px-5 py-4 text-sm text-ink-muted">
        Nothing waits for you right now: no clip to confirm or repair, no shot to review, no stick below the alert level.
      </p>
    );
  return (
    <ul className="grid gap-3 lg:grid-cols-2" aria-label="Needs you now">
      {tasks.map((t) => (
        <li key={t.key} data-testid={`home-task-${t.key}`} className="rounded-[var(--radius-card)] border border-line bg-surface p-4 shadow-[var(--shadow-card)]">
          <Link to={t.href} className="flex items-start justify-between gap-3 font-semibold text-ink hover:text-accent">
            <span>{t.title}</span>
            <span aria-hidden className="text-ink-muted">→</span>
          </Link>
          {t.examples.length > 0 && (
            <ul className="mt-2 space-y-1 text-sm">
              {t.examples.map((e) => (
                <li key={e.href + e.label} className="min-w-0 truncate">
                  <Link to={e.href} className="text-accent underline-offset-2 hover:underline">
                    {e.label}
                  </Link>
                </li>
              ))}
              {t.count > t.examples.length && <li className="text-ink-muted">and {(t.count - t.examples.length).toLocaleString("en")} more</li>}
            </ul>
          )}
        </li>
      ))}
    </ul>
  );
}
