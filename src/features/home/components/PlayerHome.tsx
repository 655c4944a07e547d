import { Link } from "react-router-dom";
import type { HomeResponse, HomeShot } from "@shared/schemas/home";
import { shotTypeLabels } from "@shared/schemas/clips";
import { formatDate } from "@/lib/format";
import { useUnits } from "@/lib/units";

function ShotLine({ s, extra }: { s: HomeShot; extra?: string }) {
  const { formatPm } = useUnits();
  return (
    <li>
      <Link to={`/readout/${s.id}`} className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-0.5 rounded-md px-2 py-1.5 hover:bg-accent-soft/40">
        <span className="min-w-0 font-medium text-ink">
          {s.label}
          <span className="ml-2 text-sm font-normal text-ink-muted">
            {shotTypeLabels[s.shotType]} · {formatDate(s.date)}
            {extra ? ` · ${extra}` : ""}
          </span>
        </span>
        <span className="tabular-nums text-ink">{s.puckExitSpeedMps === null ? "no results yet" : formatPm("speed", s.puckExitSpeedMps, s.puckExitSpeedUMps)}</span>
      </Link>
    </li>
  );
}

function Section({ title, testId, children }: { title: string; testId: string; children: React.ReactNode }) {
  return (
    <section data-testid={testId} className="rounded-[var(--radius-card)] border border-line bg-surface p-4 shadow-[var(--shadow-card)]">
      <h2 className="mb-2 text-base font-semibold text-ink">{title}</h2>
      {children}
    </section>
  );
}

/** A player's home: their latest results, their bests by shot type and what teammates shared — or, at first, what to expect. */
export function PlayerHome({ home }: { home: NonNullable<HomeResponse["player"]> }) {
  if (home.ownShots === 0 && home.shared.length === 0)
    return (
      <Section title="What to expect" testId="home-new-player">
        <ol className="list-decimal space-y-1.5 pl-5 text-sm text-ink-muted">
          <li>Your coach films your shots with a high-speed camera (or a phone's slow motion).</li>
          <li>The team's staff mark the puck and the stick frame by frame and work out the puck's speed, the stick's bend and the timing.</li>
          <li>Once a coach has looked a shot over, it appears here and under Shots, each result with its ± (how sure the number is).</li>
        </ol>
        <p className="mt-3 text-sm text-ink-muted">Nothing has reached you yet. In the meantime you can set your units and e-mails under Settings.</p>
      </Section>
    );
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Section title="Your latest results" testId="home-latest">
        {home.latest.length ? (
          <ul>{home.latest.map((s) => <ShotLine key={s.id} s={s} />)}</ul>
        ) : (
          <p className="text-sm text-ink-muted">Your shots have no results yet: the staff are still working on them.</p>
        )}
      </Section>
      <Section title="Your bests by shot type" testId="home-bests">
        {home.bests.length ? (
          <ul>{home.bests.map((s) => <ShotLine key={s.id} s={s} extra="fastest" />)}</ul>
        ) : (
          <p className="text-sm text-ink-muted">Your fastest shot of each type shows here once it has results.</p>
        )}
        <p className="mt-2 text-xs text-ink-muted">Puck exit speed. A result flagged as implausible is left out; it stays on its shot with the note.</p>
      </Section>
      {home.shared.length > 0 && (
        <Section title="Shared with you" testId="home-shared">
          <ul>{home.shared.map((s) => <ShotLine key={s.id} s={s} extra={s.playerName ?? undefined} />)}</ul>
        </Section>
      )}
    </div>
  );
}
