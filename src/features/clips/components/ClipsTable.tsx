import { useMemo } from "react";
import { Link } from "react-router-dom";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { Badge, Button, Table, TBody, Td, Th, THead, Tr, toast } from "@/components/ui";
import { cn } from "@/lib/cn";
import { clipStatusLabels, shotTypeLabels, type ClipSort, type ClipSummary } from "@shared/schemas/clips";
import { useRetryClip } from "../api/retryClip";
import { formatCount, formatFps, sessionLabel } from "../format";
import { ProgressBar } from "./ProgressBar";

const col = createColumnHelper<ClipSummary>();
/** Column names shown in each card on phones (the thumbnail and the title need none). */
const cardLabels: Record<string, string | undefined> = { player: "Player", session: "Session", shotType: "Shot type", captureFps: "Capture rate", frames: "Frames", status: "Status" };

interface Props {
  teamId: string;
  clips: ClipSummary[];
  sort: ClipSort;
  dir: "asc" | "desc";
  onSort: (sort: ClipSort, dir: "asc" | "desc") => void;
  canEdit: boolean;
}

export function ClipsTable({ teamId, clips, sort, dir, onSort, canEdit }: Props) {
  const retry = useRetryClip(teamId);
  const columns = useMemo(
    () => [
      col.display({
        id: "thumbnail",
        header: () => <span className="sr-only">Preview</span>,
        cell: ({ row: { original: c } }) =>
          c.thumbnailUrl ? (
            <img src={c.thumbnailUrl} alt="" loading="lazy" className="h-12 w-20 rounded-md bg-sunken object-cover ring-1 ring-line" />
          ) : (
            <div aria-hidden className="h-12 w-20 rounded-md bg-sunken ring-1 ring-line" />
          ),
      }),
      col.accessor("title", {
        id: "title",
        header: "Clip",
        cell: ({ row: { original: c } }) => (
          <div className="min-w-40">
            <Link to={`/clips/${c.id}`} className="font-medium text-ink hover:text-accent hover:underline">{c.title || c.originalName}</Link>
            <div className="text-xs text-ink-muted">{c.originalName}</div>
          </div>
        ),
      }),
      col.accessor((c) => c.player?.name ?? "", { id: "player", header: "Player", cell: (i) => i.getValue() || <span className="text-ink-faint">—</span> }),
      col.accessor((c) => sessionLabel(c.session), { id: "session", header: "Session", cell: (i) => <span className="text-ink-muted">{i.getValue()}</span> }),
      col.accessor("shotType", { id: "shotType", header: "Shot type", cell: (i) => shotTypeLabels[i.getValue()] }),
      col.accessor("captureFps", {
        id: "captureFps",
        header: "Capture rate",
        cell: ({ row: { original: c } }) => (
          <div className="whitespace-nowrap">
            <span className="font-medium tabular-nums">{formatFps(c.captureFps)}</span>
            <div className="text-xs text-ink-muted">stored {formatFps(c.storedFps)}</div>
            {c.needsCaptureRateConfirmation && <Badge tone="gold" className="mt-1">Confirm rate</Badge>}
          </div>
        ),
      }),
      col.accessor("frameCount", { id: "frames", header: "Frames", cell: (i) => <span className="tabular-nums">{formatCount(i.getValue())}</span> }),
      col.accessor("status", {
        id: "status",
        header: "Status",
        cell: ({ row: { original: c } }) => <StatusCell clip={c} canRetry={canEdit} retrying={retry.isPending && retry.variables === c.id}
          onRetry={() => retry.mutate(c.id, { onSuccess: () => toast.success("Extraction queued again.", "Retrying") })} />,
      }),
    ],
    [canEdit, retry],
  );
  const sorting: SortingState = [{ id: sort, desc: dir === "desc" }];
  const table = useReactTable({
    data: clips,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    state: { sorting },
    getRowId: (c) => c.id,
  });
  const sortable = new Set<string>(["title", "player", "session", "shotType", "captureFps", "frames", "status"]);

  return (
    <Table caption="Clips of the team">
      <THead>
        {table.getHeaderGroups().map((g) => (
          <Tr key={g.id}>
            {g.headers.map((h) => {
              const active = sort === h.column.id;
              const label = flexRender(h.column.columnDef.header, h.getContext());
              return (
                <Th key={h.id} aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : undefined} className={cn(h.column.id === "thumbnail" && "w-24")}>
                  {sortable.has(h.column.id) ? (
                    <button
                      type="button"
                      className={cn("inline-flex items-center gap-1 uppercase hover:text-ink", active && "text-ink")}
                      onClick={() => onSort(h.column.id as ClipSort, active && dir === "asc" ? "desc" : "asc")}
                    >
                      {label}
                      <span aria-hidden className="text-[0.65rem]">{active ? (dir === "asc" ? "▲" : "▼") : "↕"}</span>
                    </button>
                  ) : (
                    label
                  )}
                </Th>
              );
            })}
          </Tr>
        ))}
      </THead>
      <TBody>
        {table.getRowModel().rows.map((r) => (
          <Tr key={r.id} data-testid={`clip-row-${r.id}`}>
            {r.getVisibleCells().map((c) => (
              <Td key={c.id} primary={c.column.id === "title"} label={cardLabels[c.column.id]} className={cn(c.column.id === "thumbnail" && "py-2 pr-0")}>{flexRender(c.column.columnDef.cell, c.getContext())}</Td>
            ))}
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

function StatusCell({ clip: c, canRetry, retrying, onRetry }: { clip: ClipSummary; canRetry: boolean; retrying: boolean; onRetry: () => void }) {
  if (c.status === "extracting")
    return <ProgressBar className="w-44" value={c.progress} label={`${formatCount(c.framesDone)} / ${formatCount(c.frameCount)}`} />;
  if (c.status === "failed")
    return (
      <div className="max-w-64">
        <Badge tone="danger">Failed</Badge>
        <p className="mt-1 text-xs text-danger">{c.failureReason}</p>
        {canRetry && <Button size="sm" variant="secondary" className="mt-1.5" loading={retrying} onClick={onRetry}>Retry</Button>}
      </div>
    );
  return <Badge tone={c.status === "ready" ? "ok" : "neutral"}>{clipStatusLabels[c.status]}</Badge>;
}
