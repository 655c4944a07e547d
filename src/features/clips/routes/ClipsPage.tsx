import { useSearchParams } from "react-router-dom";
import { Button, Card, EmptyState, PageHeader, PageSpinner, LoadError, Pager } from "@/components/ui";
import { useActiveTeam } from "@/lib/session";
import { CLIP_PAGE_SIZE, clipSorts, clipStatuses, shotTypes, type ClipListQuery, type ClipSort } from "@shared/schemas/clips";
import { useClipOptions } from "@/entities/clip";
import { useClips } from "../api/clips";
import { ClipFilters, type FilterValues } from "../components/ClipFilters";
import { ClipsTable } from "../components/ClipsTable";
import { UploadPanel } from "../components/UploadPanel";

const PAGE_SIZE = CLIP_PAGE_SIZE;
const oneOf = <T extends string>(all: readonly T[], v: string | null): T | undefined => (v && (all as readonly string[]).includes(v) ? (v as T) : undefined);

export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, the team's clips show here.</EmptyState>;
  return <ClipsLibrary teamId={team.id} teamName={team.name} staff={team.role !== "player"} />;
}

function ClipsLibrary({ teamId, teamName, staff }: { teamId: string; teamName: string; staff: boolean }) {
  const [params, setParams] = useSearchParams();
  const query: ClipListQuery = {
    playerId: params.get("player") ?? undefined,
    sessionId: params.get("session") ?? undefined,
    shotType: oneOf(shotTypes, params.get("shotType")),
    status: oneOf(clipStatuses, params.get("status")),
    sort: oneOf(clipSorts, params.get("sort")) ?? "created",
    dir: params.get("dir") === "asc" ? "asc" : "desc",
    page: Math.max(1, Number(params.get("page")) || 1),
    pageSize: PAGE_SIZE,
  };
  const clips = useClips(teamId, query);
  const options = useClipOptions(teamId, staff);
  const filtered = !!(query.playerId || query.sessionId || query.shotType || query.status);

  const update = (patch: Record<string, string | undefined>, resetPage = true) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) if (v) next.set(k, v);
      else next.delete(k);
    if (resetPage) next.delete("page");
    setParams(next, { replace: true });
  };
  const onFilter = (p: FilterValues) =>
    update({ ...("playerId" in p ? { player: p.playerId } : {}), ...("sessionId" in p ? { session: p.sessionId } : {}), ...("shotType" in p ? { shotType: p.shotType } : {}), ...("status" in p ? { status: p.status } : {}) });

  return (
    <>
      <PageHeader
        eyebrow={teamName}
        title="Clips"
        description={staff ? "Upload shot clips with their capture rate, follow each through frame extraction, and open the frames." : "Clips of your shots, with their frames."}
      />
      <div className="flex flex-col gap-6">
        {staff && <UploadPanel teamId={teamId} />}
        <Card title="Library" description={staff ? "Filter, sort and page through the team's clips; open one to step through its frames." : "Open a clip to step through its frames."} flush>
          <div className="border-b border-line px-5 py-3">
            <ClipFilters values={{ playerId: query.playerId, sessionId: query.sessionId, shotType: query.shotType, status: query.status }} options={staff ? options.data : undefined} onChange={onFilter} />
          </div>
          {clips.isPending ? (
            <PageSpinner label="Loading clips…" />
          ) : clips.isError ? (
            <div className="p-5">
              <LoadError title="Couldn't load the clips" error={clips.error} onRetry={() => clips.refetch()} />
            </div>
          ) : clips.data.total === 0 ? (
            <div className="p-5">
              {filtered ? (
                <EmptyState title="No clip matches these filters" action={<Button variant="secondary" onClick={() => update({ player: undefined, session: undefined, shotType: undefined, status: undefined })}>Clear filters</Button>} />
              ) : staff ? (
                <EmptyState title="No clips yet — start with one shot">
                  Drop a clip from the high-speed camera (or a phone's slow motion) into the upload box above. Pick the player, the session and the
                  shot type, and enter the rate the camera captured at — 3,200 fps is a common lab setting. The server splits the clip into frames; the first
                  ones are ready to look at within seconds.
                </EmptyState>
              ) : (
                <EmptyState title="No clips of your shots yet">Your coach or analyst uploads them; they show here as soon as their frames are ready.</EmptyState>
              )}
            </div>
          ) : (
            <>
              <ClipsTable teamId={teamId} clips={clips.data.items} sort={query.sort ?? "created"} dir={query.dir ?? "desc"} canEdit={staff}
                onSort={(sort: ClipSort, dir) => update({ sort, dir })} />
              <Pager page={clips.data.page} pageSize={clips.data.pageSize} total={clips.data.total} onPage={(p) => update({ page: String(p) }, false)} noun="clips" />
            </>
          )}
        </Card>
      </div>
    </>
  );
}
