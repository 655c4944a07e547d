import { frameClock, type FrameClock } from "@shared/frame-clock";
import { eventLabels, eventOrderProblem, LANDMARKS, landmarkLabels, outsideFrameMessage, type Landmark, type Mark, type ShotEventKey, type ShotEventsDraft } from "@shared/schemas/shots";
import { newScaleBar, type CalDraft } from "./calibration-draft";
import { handlePosition, hitTest, type ToolName } from "./tools/hit";
import { cursorFor, idle, step as toolStep, type Handle, type PointerInput, type ToolEffect, type ToolState } from "./tools/pointer-tool";
import { clampFrame } from "@/components/shot/stepping/frame-stepper";
import { markAt, neighbourFrame, withMark, withoutMark } from "./tracks";
import { actualPixels, fitView, insideFrame, panBy, wheelFactor, zoomAt, type Vec2, type View } from "./viewport";

// The Digitise page's state in one place, outside React: the document (marks, events, the
// calibration draft) with undo/redo, the frame being looked at, the view transform and the active
// tool's state machine. Components subscribe to slices; Konva only draws what is here.

export interface DigitiseDoc {
  marks: Partial<Record<Landmark, Mark[]>>;
  events: ShotEventsDraft;
  calibration: CalDraft | null;
}

export interface Notice {
  tone: "warn" | "info";
  text: string;
  /** Increments so the same text twice still shows. */
  seq: number;
}

export interface DigitiseSetup {
  readOnly: boolean;
  frameSize: { width: number; height: number };
  frameStart: number;
  frameEnd: number;
  captureFps: number;
  /** The clip's frame clock over the shot (decision 135); frame ÷ capture rate when absent. */
  clock?: FrameClock;
  /** Capture ms from the clip's first frame to frameStart. */
  startMs?: number;
  doc: DigitiseDoc;
  /** Where to open (defaults to the shot's first frame). */
  frame?: number;
}

export interface DigitiseState extends Omit<DigitiseSetup, "frame" | "clock" | "startMs"> {
  clock: FrameClock;
  startMs: number;
  canUndo: boolean;
  canRedo: boolean;
  frame: number;
  view: View;
  stage: { width: number; height: number };
  /** True until the analyst zooms or pans: a resize then refits. */
  fitted: boolean;
  tool: ToolName;
  pointer: ToolState;
  hover: Handle | null;
  cursor: string;
  /** A handle being dragged, drawn at `at` until the drop commits it. */
  preview: { handle: Handle; at: Vec2 } | null;
  activeLandmark: Landmark;
  visible: Record<Landmark, boolean>;
  /** Marks of the past frames drawn behind each landmark. */
  trail: number;
  autoAdvance: boolean;
  /** Placing the seeds of an auto-digitise run: each click places the active landmark and moves on to the next one. */
  seeding: boolean;
  notice: Notice | null;
}

const HISTORY_LIMIT = 1000;
export const TRAIL_CHOICES = [0, 5, 15, 40] as const;

type Listener = () => void;

export class DigitiseStore {
  private state: DigitiseState;
  private past: DigitiseDoc[] = [];
  private future: DigitiseDoc[] = [];
  private listeners = new Set<Listener>();
  private docListeners = new Set<(doc: DigitiseDoc) => void>();
  private noticeSeq = 0;
  /** Gets first say on a click that places a mark (the tracking assist's corrections). */
  placeHandler: ((landmark: Landmark, frame: number, at: Vec2) => boolean) | null = null;

  constructor(setup: DigitiseSetup) {
    const { frame, ...rest } = setup;
    this.state = {
      ...rest,
      clock: setup.clock ?? frameClock(null, setup.captureFps),
      startMs: setup.startMs ?? ((setup.frameStart - 1) * 1000) / setup.captureFps,
      canUndo: false,
      canRedo: false,
      frame: this.clampFrame(frame ?? setup.frameStart, setup),
      view: { zoom: 1, panX: 0, panY: 0 },
      stage: { width: 0, height: 0 },
      fitted: true,
      tool: "mark",
      pointer: idle,
      hover: null,
      cursor: setup.readOnly ? "grab" : "crosshair",
      preview: null,
      activeLandmark: "puck",
      visible: Object.fromEntries(LANDMARKS.map((k) => [k, true])) as Record<Landmark, boolean>,
      trail: 15,
      autoAdvance: false,
      seeding: false,
      notice: null,
    };
  }

  // ---- subscription ------------------------------------------------------------------------
  getState = () => this.state;
  subscribe = (l: Listener) => {
    this.listeners.add(l);
    return () => void this.listeners.delete(l);
  };
  /** Called after every change of the document (edits, undo, redo), not after navigation. */
  onDocChange(l: (doc: DigitiseDoc) => void) {
    this.docListeners.add(l);
    return () => void this.docListeners.delete(l);
  }

  private set(patch: Partial<DigitiseState>) {
    this.state = { ...this.state, ...patch };
    for (const l of this.listeners) l();
  }

  private clampFrame(f: number, s: { frameStart: number; frameEnd: number } = this.state) {
    return clampFrame(f, s.frameStart, s.frameEnd);
  }

  notify(text: string, tone: Notice["tone"] = "warn") {
    this.set({ notice: { text, tone, seq: ++this.noticeSeq } });
  }
  clearNotice() {
    if (this.state.notice) this.set({ notice: null });
  }

  // ---- the document, with history ----------------------------------------------------------
  private commit(doc: DigitiseDoc, extra: Partial<DigitiseState> = {}) {
    if (this.state.readOnly) return false;
    this.past.push(this.state.doc);
    if (this.past.length > HISTORY_LIMIT) this.past.shift();
    this.future = [];
    this.set({ ...extra, doc, canUndo: true, canRedo: false });
    for (const l of this.docListeners) l(doc);
    return true;
  }

  undo() {
    const prev = this.past.pop();
    if (!prev) return;
    this.future.push(this.state.doc);
    this.set({ doc: prev, canUndo: this.past.length > 0, canRedo: true });
    for (const l of this.docListeners) l(prev);
  }

  redo() {
    const next = this.future.pop();
    if (!next) return;
    this.past.push(this.state.doc);
    this.set({ doc: next, canUndo: true, canRedo: this.future.length > 0 });
    for (const l of this.docListeners) l(next);
  }

  /** Replace the document from outside (the server's copy after a conflict); history starts again. */
  replaceDoc(doc: DigitiseDoc) {
    this.past = [];
    this.future = [];
    this.set({ doc, canUndo: false, canRedo: false, preview: null });
  }

  /** Place the active landmark on the current frame; a click outside the picture is refused. */
  placeMark(at: Vec2, landmark: Landmark = this.state.activeLandmark) {
    const s = this.state;
    if (!insideFrame(at, s.frameSize)) {
      this.notify(`Not placed: ${outsideFrameMessage({ ...s.frameSize, frameStart: 1, frameEnd: 1 }, at[0], at[1])}.`);
      return false;
    }
    if (!s.readOnly && this.placeHandler?.(landmark, s.frame, at)) return true;
    const marks = { ...s.doc.marks, [landmark]: withMark(s.doc.marks[landmark], s.frame, at[0], at[1]) };
    const visible = s.visible[landmark] ? s.visible : { ...s.visible, [landmark]: true };
    if (!this.commit({ ...s.doc, marks }, { visible })) return false;
    if (s.seeding) this.nextSeed(landmark);
    else if (s.autoAdvance && s.frame < s.frameEnd) this.goto(s.frame + 1);
    return true;
  }

  // ---- seeds of an auto-digitise run -------------------------------------------------------
  /** Landmarks still to place on this frame, in the usual order. */
  unseeded(frame = this.state.frame): Landmark[] {
    return LANDMARKS.filter((k) => !markAt(this.state.doc.marks[k], frame));
  }

  /** Each click now places the next landmark not yet on this frame, puck first. */
  startSeeding() {
    if (this.state.readOnly) return;
    const todo = this.unseeded();
    if (!todo.length) return this.notify("Every landmark is already on this frame.", "info");
    this.set({ seeding: true, tool: "mark", activeLandmark: todo[0], visible: { ...this.state.visible, [todo[0]]: true } });
  }

  stopSeeding() {
    if (this.state.seeding) this.set({ seeding: false });
  }

  /** Leave the active landmark unplaced (the butt end is optional) and go on to the next. */
  skipSeed() {
    if (this.state.seeding) this.nextSeed(this.state.activeLandmark);
  }

  private nextSeed(after: Landmark) {
    const todo = this.unseeded();
    const i = LANDMARKS.indexOf(after);
    const next = todo.find((k) => LANDMARKS.indexOf(k) > i);
    if (next) this.set({ activeLandmark: next, visible: { ...this.state.visible, [next]: true } });
    else this.set({ seeding: false });
  }

  /**
   * Accepted tracking proposals as one undoable edit: marks on frames the analyst left empty,
   * events the analyst has not set (refused as a whole when their order is impossible), and a
   * scale bar when given.
   */
  acceptProposals(add: Partial<Record<Landmark, readonly Mark[]>>, events: Partial<Record<ShotEventKey, number>>, calibration?: CalDraft) {
    const s = this.state;
    const marks = { ...s.doc.marks };
    for (const [k, list] of Object.entries(add) as [Landmark, readonly Mark[]][]) {
      let track = marks[k];
      for (const [f, x, y] of list) {
        if (f < s.frameStart || f > s.frameEnd || !insideFrame([x, y], s.frameSize) || markAt(track, f)) continue;
        track = withMark(track, f, x, y);
      }
      if (track) marks[k] = track;
    }
    let merged: ShotEventsDraft = { ...s.doc.events, ...events };
    const problem = eventOrderProblem(merged);
    if (problem) {
      this.notify(`Proposed events not set: ${problem.message}.`);
      merged = s.doc.events;
    }
    return this.commit({ ...s.doc, marks, events: merged, calibration: calibration ?? s.doc.calibration });
  }

  deleteMark(landmark: Landmark = this.state.activeLandmark, frame = this.state.frame) {
    const s = this.state;
    if (!markAt(s.doc.marks[landmark], frame)) {
      this.notify(`${landmarkLabels[landmark]} has no mark on frame ${frame}.`, "info");
      return false;
    }
    return this.commit({ ...s.doc, marks: { ...s.doc.marks, [landmark]: withoutMark(s.doc.marks[landmark], frame) } });
  }

  /** Proposed marks accepted at once (tracking assist): one undo step for the lot. */
  placeMany(landmark: Landmark, marks: readonly Mark[]) {
    const s = this.state;
    let track = s.doc.marks[landmark];
    for (const [f, x, y] of marks) {
      if (f < s.frameStart || f > s.frameEnd || !insideFrame([x, y], s.frameSize)) continue;
      track = withMark(track, f, x, y);
    }
    return this.commit({ ...s.doc, marks: { ...s.doc.marks, [landmark]: track ?? [] } });
  }

  private moveHandle(h: Handle, to: Vec2) {
    const s = this.state;
    if (!insideFrame(to, s.frameSize)) {
      this.notify(`Not moved: ${outsideFrameMessage({ ...s.frameSize, frameStart: 1, frameEnd: 1 }, to[0], to[1])}.`);
      return;
    }
    if (h.kind === "mark") {
      this.commit({ ...s.doc, marks: { ...s.doc.marks, [h.landmark]: withMark(s.doc.marks[h.landmark], h.frame, to[0], to[1]) } });
      return;
    }
    const c = s.doc.calibration;
    if (h.kind === "scaleBar" && c?.type === "scaleBar") this.commit({ ...s.doc, calibration: { ...c, [h.end]: to } });
    if (h.kind === "plane" && c?.type === "plane")
      this.commit({ ...s.doc, calibration: { ...c, points: c.points.map((p, i) => (i === h.index ? { ...p, image: to } : p)) } });
  }

  /** Set an event to the current frame, or clear it when it is already there. Impossible orders are refused. */
  toggleEvent(key: ShotEventKey, frame = this.state.frame) {
    const s = this.state;
    const events = { ...s.doc.events };
    if (events[key] === frame) delete events[key];
    else events[key] = frame;
    const problem = eventOrderProblem(events);
    if (problem) {
      this.notify(`${eventLabels[key]} not set: ${problem.message}.`);
      return false;
    }
    return this.commit({ ...s.doc, events });
  }

  clearEvent(key: ShotEventKey) {
    const s = this.state;
    if (s.doc.events[key] === undefined) return false;
    const events = { ...s.doc.events };
    delete events[key];
    return this.commit({ ...s.doc, events });
  }

  /** Set one event to a frame (a proposal confirmed); impossible orders are refused. */
  setEvent(key: ShotEventKey, frame: number) {
    const s = this.state;
    const events = { ...s.doc.events, [key]: frame };
    const problem = eventOrderProblem(events);
    if (problem) {
      this.notify(`${eventLabels[key]} not set: ${problem.message}.`);
      return false;
    }
    return this.commit({ ...s.doc, events });
  }

  setCalibration(calibration: CalDraft | null) {
    return this.commit({ ...this.state.doc, calibration });
  }

  // ---- navigation ---------------------------------------------------------------------------
  goto(frame: number) {
    const f = this.clampFrame(frame);
    if (f !== this.state.frame) this.set({ frame: f, hover: null });
  }
  stepBy(d: number) {
    this.goto(this.state.frame + d);
  }
  /** Previous/next frame on which the active landmark is marked. */
  gotoNeighbourMark(dir: -1 | 1) {
    const f = neighbourFrame(this.state.doc.marks[this.state.activeLandmark], this.state.frame, dir);
    if (f === null) this.notify(`No ${dir < 0 ? "earlier" : "later"} ${landmarkLabels[this.state.activeLandmark].toLowerCase()} mark.`, "info");
    else this.goto(f);
  }
  gotoEvent(key: ShotEventKey) {
    const f = this.state.doc.events[key];
    if (f === undefined) this.notify(`${eventLabels[key]} is not set yet.`, "info");
    else this.goto(f);
  }

  // ---- view --------------------------------------------------------------------------------
  setStage(width: number, height: number) {
    const s = this.state;
    if (s.stage.width === width && s.stage.height === height) return;
    const stage = { width, height };
    this.set({ stage, view: s.fitted ? fitView(stage, s.frameSize) : s.view });
  }
  fit() {
    this.set({ view: fitView(this.state.stage, this.state.frameSize), fitted: true });
  }
  originalPixels() {
    this.set({ view: actualPixels(this.state.view, this.state.stage), fitted: false });
  }
  zoomBy(factor: number, anchor: Vec2 = [this.state.stage.width / 2, this.state.stage.height / 2]) {
    this.set({ view: zoomAt(this.state.view, anchor, factor), fitted: false });
  }
  wheel(anchor: Vec2, deltaY: number) {
    this.zoomBy(wheelFactor(deltaY), anchor);
  }
  setView(view: View) {
    this.set({ view, fitted: false });
  }
  /** A second finger landed: whatever the first one started (a tap, a drag) is called off. */
  cancelPointer() {
    this.set({ pointer: idle, preview: null });
  }

  // ---- tools and pointer ---------------------------------------------------------------------
  /** Picking a tool never changes the calibration: its first click does (one undoable edit). */
  setTool(tool: ToolName) {
    if (this.state.readOnly && tool !== "mark") return;
    this.set({ tool, pointer: idle, preview: null });
  }
  setActiveLandmark(l: Landmark) {
    const s = this.state;
    this.set({ activeLandmark: l, visible: s.visible[l] ? s.visible : { ...s.visible, [l]: true }, tool: "mark" });
  }
  cycleLandmark(d: 1 | -1) {
    const i = LANDMARKS.indexOf(this.state.activeLandmark);
    this.setActiveLandmark(LANDMARKS[(i + d + LANDMARKS.length) % LANDMARKS.length]);
  }
  toggleVisible(l: Landmark = this.state.activeLandmark) {
    this.set({ visible: { ...this.state.visible, [l]: !this.state.visible[l] } });
  }
  showAll() {
    this.set({ visible: Object.fromEntries(LANDMARKS.map((k) => [k, true])) as Record<Landmark, boolean> });
  }
  setTrail(n: number) {
    this.set({ trail: n });
  }
  cycleTrail() {
    const i = TRAIL_CHOICES.indexOf(this.state.trail as (typeof TRAIL_CHOICES)[number]);
    this.setTrail(TRAIL_CHOICES[(i + 1) % TRAIL_CHOICES.length]);
  }
  setAutoAdvance(on: boolean) {
    this.set({ autoAdvance: on });
  }

  private scene() {
    const s = this.state;
    return { tool: s.tool, frame: s.frame, view: s.view, marks: s.doc.marks, visible: s.visible, calibration: s.doc.calibration };
  }

  pointer(ev: PointerInput) {
    const s = this.state;
    const scene = this.scene();
    const { state, effects } = toolStep(s.pointer, ev, {
      view: s.view,
      frameSize: s.frameSize,
      readOnly: s.readOnly,
      hit: (p, touch) => hitTest(scene, p, touch),
      handlePosition: (h) => handlePosition(scene, h),
    });
    const hover = ev.type === "move" && state.mode === "idle" && !s.readOnly ? hitTest(scene, ev.screen) : s.hover;
    this.set({ pointer: state, hover, cursor: cursorFor(state, hover, s.readOnly) });
    for (const e of effects) this.apply(e);
  }

  private apply(e: ToolEffect) {
    const s = this.state;
    switch (e.type) {
      case "pan":
        this.set({ view: panBy(s.view, e.dx, e.dy), fitted: false });
        return;
      case "preview":
        this.set({ preview: { handle: e.handle, at: e.at } });
        return;
      case "endPreview":
        this.set({ preview: null });
        return;
      case "move":
        this.moveHandle(e.handle, e.to);
        return;
      case "select":
        if (e.handle.kind === "mark") this.setActiveLandmark(e.handle.landmark);
        return;
      case "click":
        this.click(e.at);
        return;
    }
  }

  /** What a click on empty picture means for the active tool. */
  private click(at: Vec2) {
    const s = this.state;
    if (s.tool === "mark") {
      this.placeMark(at);
      return;
    }
    if (!insideFrame(at, s.frameSize)) {
      this.notify(`Not placed: ${outsideFrameMessage({ ...s.frameSize, frameStart: 1, frameEnd: 1 }, at[0], at[1])}.`);
      return;
    }
    const c = s.doc.calibration;
    if (s.tool === "scaleBar") {
      const bar = c?.type === "scaleBar" ? c : (newScaleBar() as Extract<CalDraft, { type: "scaleBar" }>);
      if (!bar.a || (bar.a && bar.b)) this.setCalibration({ ...bar, a: at, b: null });
      else this.setCalibration({ ...bar, b: at });
      return;
    }
    const plane = c?.type === "plane" ? c : { type: "plane" as const, points: [] };
    this.setCalibration({ ...plane, points: [...plane.points, { image: at, world: null }] });
  }
}
