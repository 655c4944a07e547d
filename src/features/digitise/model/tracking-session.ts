import type { Landmark, Mark } from "@shared/schemas/shots";

// The tracking assist as the page sees it: a run proposes marks for one landmark frame by frame;
// the analyst then accepts them all, accepts up to a frame, or corrects one (which accepts the
// ones before it and runs again from the correction). Proposals are not marks until accepted:
// they live here, drawn differently, and never reach the autosave.
//
//   idle ──start──▶ running ──done / stop──▶ review ──accept all / up to / discard──▶ idle
//                     │  ▲                     │
//                     │  └──────correct one────┘ (accepts the earlier ones, runs again)
//                     └──cancel──▶ review (what was proposed so far stays to review)

export interface Proposal {
  frame: number;
  x: number;
  y: number;
  confidence: number;
}

export type TrackingState =
  | { mode: "idle"; lastMessage: string | null }
  | { mode: "running"; landmark: Landmark; from: number; proposals: Proposal[]; done: number; total: number }
  | { mode: "review"; landmark: Landmark; from: number; proposals: Proposal[]; message: string };

/** What the session asks the page to do. */
export interface TrackingEffects {
  /** Store these marks as one undoable edit. */
  accept(landmark: Landmark, marks: Mark[]): void;
  /** Start a run from this confirmed mark (and the one before it, for direction). */
  run(landmark: Landmark, start: Mark): void;
  cancelRun(): void;
}

export class TrackingSession {
  state: TrackingState = { mode: "idle", lastMessage: null };
  private listeners = new Set<() => void>();

  constructor(private readonly fx: TrackingEffects) {}

  subscribe = (l: () => void) => {
    this.listeners.add(l);
    return () => void this.listeners.delete(l);
  };
  getState = () => this.state;
  private set(s: TrackingState) {
    this.state = s;
    for (const l of this.listeners) l();
  }

  start(landmark: Landmark, start: Mark, total: number) {
    if (this.state.mode === "running") this.fx.cancelRun();
    this.set({ mode: "running", landmark, from: start[0], proposals: [], done: 0, total });
    this.fx.run(landmark, start);
  }

  proposal(p: Proposal) {
    const s = this.state;
    if (s.mode !== "running") return;
    this.set({ ...s, proposals: [...s.proposals, p] });
  }

  progress(done: number, total: number) {
    const s = this.state;
    if (s.mode === "running") this.set({ ...s, done, total });
  }

  finished(message: string) {
    const s = this.state;
    if (s.mode !== "running") return;
    if (!s.proposals.length) this.set({ mode: "idle", lastMessage: message });
    else this.set({ mode: "review", landmark: s.landmark, from: s.from, proposals: s.proposals, message });
  }

  failed(message: string) {
    this.set({ mode: "idle", lastMessage: message });
  }

  cancel() {
    if (this.state.mode !== "running") return;
    this.fx.cancelRun();
    this.finished("Stopped: you cancelled the run.");
  }

  private proposalsOf(): { landmark: Landmark; proposals: Proposal[] } | null {
    const s = this.state;
    return s.mode === "idle" ? null : { landmark: s.landmark, proposals: s.proposals };
  }

  acceptAll() {
    this.acceptUpTo(Infinity);
  }

  /** Accept the proposals up to and including `frame`; drop the rest. */
  acceptUpTo(frame: number) {
    const p = this.proposalsOf();
    if (!p) return;
    if (this.state.mode === "running") this.fx.cancelRun();
    const marks = p.proposals.filter((q) => q.frame <= frame).map((q) => [q.frame, q.x, q.y] as Mark);
    if (marks.length) this.fx.accept(p.landmark, marks);
    this.set({ mode: "idle", lastMessage: marks.length ? `Accepted ${marks.length} proposed mark${marks.length === 1 ? "" : "s"}.` : null });
  }

  discard() {
    if (this.state.mode === "running") this.fx.cancelRun();
    if (this.state.mode !== "idle") this.set({ mode: "idle", lastMessage: "Proposals discarded." });
  }

  /**
   * The analyst placed `landmark` at `at` on `frame` while proposals are shown. When it is the
   * tracked landmark on a proposed frame, that is a correction: accept the earlier proposals with
   * the corrected mark and run again from it. Returns true when handled here.
   */
  correct(landmark: Landmark, frame: number, at: [number, number]): boolean {
    const p = this.proposalsOf();
    if (!p || landmark !== p.landmark || !p.proposals.some((q) => q.frame === frame)) return false;
    if (this.state.mode === "running") this.fx.cancelRun();
    const before = p.proposals.filter((q) => q.frame < frame).map((q) => [q.frame, q.x, q.y] as Mark);
    const fixed: Mark = [frame, at[0], at[1]];
    this.fx.accept(landmark, [...before, fixed]);
    const total = this.state.mode === "running" ? this.state.total : p.proposals.length;
    this.set({ mode: "running", landmark, from: frame, proposals: [], done: 0, total });
    this.fx.run(landmark, fixed);
    return true;
  }

  /** The proposal on a frame, if any. */
  proposalAt(frame: number): Proposal | null {
    const p = this.proposalsOf();
    return p?.proposals.find((q) => q.frame === frame) ?? null;
  }
}
