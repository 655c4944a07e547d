import { Link } from "react-router-dom";
import { Badge, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { formatDate } from "@/lib/format";
import { formatValue, shotTitle, shotTypeLabels, type ShotListItem } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";

interface Props {
  shots: ShotListItem[];
  units: UnitSystem;
  showPlayer: boolean;
  selected: string[];
  onToggle: (id: string) => void;
}

/** The shots one may see, newest first; tick two to put them side by side. */
export function ShotsTable({ shots, units, showPlayer, selected, onToggle }: Props) {
  return (
    <Table caption="Shots">
      <THead>
        <Tr>
          <Th className="w-10">
            <span className="sr-only">Compare</span>
          </Th>
          <Th>Shot</Th>
          {showPlayer && <Th>Player</Th>}
          <Th>Stick</Th>
          <Th className="text-right">Puck exit speed</Th>
          <Th className="text-right">Load</Th>
          <Th className="text-right">Contact</Th>
          <Th>Status</Th>
        </Tr>
      </THead>
      <TBody>
        {shots.map((s) => {
          const checked = selected.includes(s.id);
          const title = shotTitle({ ...s, playerName: showPlayer ? null : s.playerName });
          return (
            <Tr key={s.id} className={checked ? "bg-accent-soft/50" : "hover:bg-sunken/50"} data-testid="shot-row">
              <Td>
                <input
                  type="checkbox"
                  className="size-4 accent-accent"
                  aria-label={`Compare ${title}`}
                  checked={checked}
                  disabled={!checked && selected.length >= 2}
                  onChange={() => onToggle(s.id)}
                />
              </Td>
              <Td primary>
                <Link to={`/readout/${s.id}`} className="font-medium text-ink hover:text-accent hover:underline">
                  {title}
                </Link>
                <span className="block text-xs text-ink-muted">
                  {shotTypeLabels[s.shotType]} · {formatDate(s.date)}
                  {s.venue ? ` · ${s.venue}` : ""} · {s.captureFps.toLocaleString()} fps
                </span>
              </Td>
              {showPlayer && <Td label="Player">{s.playerName ?? <span className="text-ink-faint">No player</span>}</Td>}
              <Td label="Stick">{s.stickLabel ?? <span className="text-ink-faint">—</span>}</Td>
              <Td label="Puck exit speed" className={`text-right font-medium tabular-nums ${s.recomputing ? "text-ink-faint" : ""}`}>{formatValue("speed", s.puckExitSpeedMps, units)}</Td>
              <Td label="Load" className="text-right tabular-nums">{formatValue("time", s.loadTimeMs, units)}</Td>
              <Td label="Contact" className="text-right tabular-nums">{formatValue("time", s.contactTimeMs, units)}</Td>
              <Td label="Status">
                <span className="flex flex-wrap gap-1">
                  {s.recomputing ? <Badge tone="neutral">Recomputing…</Badge> : s.hasResults ? <Badge tone="ok">Results</Badge> : <Badge tone="warn">Needs digitising</Badge>}
                  {showPlayer && (s.published ? <Badge tone="neutral">Published</Badge> : <Badge tone="gold">In review</Badge>)}
                  {s.sharedWithMe && <Badge tone="accent">Shared with you</Badge>}
                  {s.shareCount > 0 && <Badge tone="neutral">Shared ×{s.shareCount}</Badge>}
                </span>
              </Td>
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}
