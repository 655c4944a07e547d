import { useSyncExternalStore } from "react";

// Stepping through a clip's frames, shared by the Clip page and the Digitise page. The frame lives
// outside React and changes synchronously, so thirty quick arrow presses move thirty frames even
// when React has not painted in between (a frame read from the last render would drop presses).

export interface StepperState {
  frame: number;
  first: number;
  last: number;
}

/** A frame number kept inside [first, last], whole. */
export const clampFrame = (f: number, first: number, last: number) => Math.min(last, Math.max(first, Math.round(f)));

export class FrameStepper {
  private state: StepperState;
  private listeners = new Set<() => void>();

  constructor(first: number, last: number, frame = first) {
    this.state = { first, last: Math.max(first, last), frame: clampFrame(frame, first, Math.max(first, last)) };
  }

  getState = () => this.state;
  subscribe = (l: () => void) => {
    this.listeners.add(l);
    return () => void this.listeners.delete(l);
  };
  private set(next: StepperState) {
    if (next.frame === this.state.frame && next.first === this.state.first && next.last === this.state.last) return;
    this.state = next;
    for (const l of this.listeners) l();
  }

  goto(frame: number) {
    if (!Number.isFinite(frame)) return;
    const { first, last } = this.state;
    this.set({ first, last, frame: clampFrame(frame, first, last) });
  }
  stepBy(d: number) {
    this.goto(this.state.frame + d);
  }
  /** The frames that exist changed (a clip still extracting gains frames). */
  setRange(first: number, last: number) {
    const l = Math.max(first, last);
    this.set({ first, last: l, frame: clampFrame(this.state.frame, first, l) });
  }
}

/** The stepper's state in a component, re-rendered on every change. */
export function useStepper(stepper: FrameStepper): StepperState {
  return useSyncExternalStore(stepper.subscribe, stepper.getState, stepper.getState);
}
