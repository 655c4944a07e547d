import { Button } from "./Button";

/** Previous / next under a paged table; `noun` names what is paged ("clips", "shots"). */
export function Pager({ page, pageSize, total, onPage, noun }: { page: number; pageSize: number; total: number; onPage: (p: number) => void; noun: string }) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const from = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const to = Math.min(total, page * pageSize);
  const n = (x: number) => x.toLocaleString("en");
  return (
    <nav aria-label={`Pages of ${noun}`} className="flex items-center justify-between gap-3 border-t border-line px-5 py-3 text-sm text-ink-muted">
      <span>{total === 0 ? `No ${noun}` : `${n(from)}–${n(to)} of ${n(total)}`}</span>
      <div className="flex items-center gap-2">
        <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)}>Previous</Button>
        <span className="tabular-nums">Page {n(page)} of {n(pages)}</span>
        <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => onPage(page + 1)}>Next</Button>
      </div>
    </nav>
  );
}
