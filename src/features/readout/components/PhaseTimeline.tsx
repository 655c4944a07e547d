import { Link } from "react-router-dom";
import { Card } from "@/components/ui";
import { FrameImage } from "@/components/shot/FrameImage";
import { digitiseUrl } from "@/components/shot/frames";
import { EVENTS, eventLabels } from "@shared/schemas/shots";
import type { ShotReadout } from "@shared/schemas/readout";

const signed = (v: number) => `${v > 0 ? "+" : v < 0 ? "−" : ""}${Math.abs(v).toFixed(1)} ms`;

/** Ice strike → puck strike → peak bend → release: the frame at each event, and the phases in proportion. */
export function PhaseTimeline({ teamId, readout: r }: { teamId: string; readout: ShotReadout }) {
  const aspect = r.clip.width && r.clip.height ? r.clip.width / r.clip.height : 16 / 9;
  const load = r.results?.loadTimeMs ?? null;
  const contact = r.results?.contactTimeMs ?? null;
  return (
    <Card title="Phase timeline" description="The frame at each event. Open any of them on the Digitise page.">
      <ol className="grid grid-cols-2 gap-4 lg:grid-cols-4">
        {EVENTS.map((k, i) => {
          const e = r.events.find((x) => x.key === k);
          return (
            <li key={k} className="min-w-0" data-testid={`event-${k}`}>
              <p className="mb-2 flex items-center gap-2 text-sm font-semibold text-ink">
                <span aria-hidden className="flex size-6 items-center justify-center rounded-full bg-accent-soft text-xs text-accent-strong">
                  {i + 1}
                </span>
                {eventLabels[k]}
              </p>
              {e ? (
                <Link to={digitiseUrl(r.clip.id, r.shot.id, e.frame)} className="group block" title={`Open frame ${e.frame} on the Digitise page`}>
                  <FrameImage teamId={teamId} clipId={r.clip.id} frame={e.frame} alt={`${eventLabels[k]}, frame ${e.frame}`} aspect={aspect} className="ring-accent transition group-hover:ring-2" />
                  <p className="mt-1.5 text-sm text-ink-muted tabular-nums">
                    Frame {e.frame}
                    {e.tFromStrikeMs !== null && <> · {k === "puckStrike" ? "0 ms" : signed(e.tFromStrikeMs)}</>}
                  </p>
                </Link>
              ) : (
                <div className="flex items-center justify-center rounded-lg border border-dashed border-line-strong p-4 text-center text-sm text-ink-muted" style={{ aspectRatio: String(aspect) }}>
                  Not marked yet
                </div>
              )}
            </li>
          );
        })}
      </ol>
      {contact !== null && <PhaseBar load={load} contact={contact} peak={r.events.find((e) => e.key === "peakBend")?.tFromStrikeMs ?? null} />}
    </Card>
  );
}

function PhaseBar({ load, contact, peak }: { load: number | null; contact: number; peak: number | null }) {
  const l = load ?? 0;
  const total = l + contact || 1;
  return (
    <div className="mt-5" aria-label={`Load ${load === null ? "not measured" : `${load.toFixed(1)} ms`}, contact ${contact.toFixed(1)} ms`}>
      <div className="relative flex h-8 overflow-hidden rounded-md text-sm font-semibold">
        {l > 0 && (
          <div className="flex items-center bg-gold px-3 whitespace-nowrap text-ink" style={{ width: `${(l / total) * 100}%` }}>
            Load {l.toFixed(1)} ms
          </div>
        )}
        <div className="flex items-center bg-accent-soft px-3 whitespace-nowrap text-accent-strong" style={{ width: `${(contact / total) * 100}%` }}>
          Contact {contact.toFixed(1)} ms
        </div>
      </div>
      {peak !== null && (
        <div className="relative h-3">
          <span aria-hidden className="absolute -top-0.5 -translate-x-1/2 text-xs leading-none text-ink" style={{ left: `${((l + peak) / total) * 100}%` }} title={`Peak bend at ${signed(peak)} from puck strike`}>
            ▲
          </span>
        </div>
      )}
      <div className={`${peak !== null ? "" : "mt-1 "}flex justify-between text-xs text-ink-muted`}>
        <span>{l > 0 ? "Ice strike" : "Puck strike"}</span>
        {peak !== null && <span>▲ peak bend, {signed(peak)} from puck strike</span>}
        <span>Release</span>
      </div>
    </div>
  );
}
