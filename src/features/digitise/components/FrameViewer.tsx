import { useEffect, useReducer, useRef } from "react";
import { Image as KImage, Layer, Rect, Stage } from "react-konva";
import type { FrameCache } from "@/components/shot/stepping/frame-cache";
import type { DigitiseStore } from "../model/store";
import { pinchView, type Pinch } from "../model/pinch";
import type { Vec2 } from "../model/viewport";
import { CalibrationOverlay } from "./CalibrationOverlay";
import { MarksOverlay } from "./MarksOverlay";
import { useDigitise } from "./useDigitise";
import { ViewerHud } from "./ViewerHud";

declare global {
  interface Window {
    /** Set by the Digitise benchmark: told each time a frame's picture has been drawn. */
    __lfFrameDrawn?: (frame: number) => void;
  }
}

/**
 * The frame at its original pixels under the view transform, with the overlays on top. Pointer
 * and wheel events go to the store in stage coordinates; the store's tools turn them into frame
 * pixels. Konva only draws.
 */
export function FrameViewer({ store, cache, extraOverlay }: { store: DigitiseStore; cache: FrameCache<ImageBitmap>; extraOverlay?: React.ReactNode }) {
  const box = useRef<HTMLDivElement>(null);
  const s = useDigitise(store, (st) => ({ frame: st.frame, view: st.view, stage: st.stage, frameSize: st.frameSize, cursor: st.cursor, seeding: st.seeding }));
  const [, rerender] = useReducer((n: number) => n + 1, 0);
  const shown = useRef<{ frame: number; img: ImageBitmap } | null>(null);

  // Size: the stage fills its box.
  useEffect(() => {
    const el = box.current!;
    const ro = new ResizeObserver(() => store.setStage(Math.floor(el.clientWidth), Math.floor(el.clientHeight)));
    ro.observe(el);
    return () => ro.disconnect();
  }, [store]);

  // Frames: look at the current one (prefetching around it); redraw when it arrives.
  useEffect(() => {
    void cache.focus(s.frame).catch(() => {});
  }, [cache, s.frame]);
  // Placing seeds starts from a panel that sits below the picture on phones: bring the picture back
  // into view, clear of the sticky header (scroll-mt).
  useEffect(() => {
    if (s.seeding) box.current?.scrollIntoView?.({ block: "nearest" });
  }, [s.seeding]);
  useEffect(() => cache.onLoaded((f) => f === store.getState().frame && rerender()), [cache, store]);

  const img = cache.get(s.frame);
  if (img) shown.current = { frame: s.frame, img };
  const current = shown.current;
  const stale = !current || current.frame !== s.frame;

  // Native listeners: pointer capture while dragging, a non-passive wheel so the page does not
  // scroll, and two fingers for pinch zoom (a tap places, a drag of a mark moves it, as with a mouse).
  useEffect(() => {
    const el = box.current!;
    const at = (e: { clientX: number; clientY: number }): Vec2 => {
      const r = el.getBoundingClientRect();
      return [e.clientX - r.left, e.clientY - r.top];
    };
    const fingers = new Map<number, Vec2>();
    let pinch: Pinch | null = null;
    /** After a pinch, the finger left on the picture does nothing until it lifts too. */
    let spent = false;
    const down = (e: PointerEvent) => {
      if (e.target instanceof HTMLElement && e.target.closest("[data-hud]")) return;
      el.setPointerCapture(e.pointerId);
      el.focus({ preventScroll: true });
      if (e.pointerType === "touch") {
        fingers.set(e.pointerId, at(e));
        if (fingers.size === 2) {
          const [a, b] = [...fingers.values()];
          store.cancelPointer();
          pinch = { view: store.getState().view, a, b };
          return;
        }
        if (fingers.size > 2 || spent) return;
      }
      store.pointer({ type: "down", screen: at(e), button: e.button, panKey: e.altKey, touch: e.pointerType === "touch" });
    };
    const move = (e: PointerEvent) => {
      if (e.pointerType === "touch" && fingers.has(e.pointerId)) {
        fingers.set(e.pointerId, at(e));
        if (pinch && fingers.size >= 2) {
          const [a, b] = [...fingers.values()];
          store.setView(pinchView(pinch, a, b));
          return;
        }
        if (spent) return;
      }
      store.pointer({ type: "move", screen: at(e), touch: e.pointerType === "touch" });
    };
    const up = (e: PointerEvent) => {
      if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
      if (e.pointerType === "touch") {
        fingers.delete(e.pointerId);
        if (pinch) {
          pinch = null;
          spent = fingers.size > 0;
          return;
        }
        if (spent) {
          spent = fingers.size > 0;
          return;
        }
      }
      store.pointer({ type: "up", screen: at(e), touch: e.pointerType === "touch" });
    };
    const cancel = (e: PointerEvent) => {
      fingers.delete(e.pointerId);
      pinch = null;
      store.pointer({ type: "cancel", screen: at(e) });
    };
    const wheel = (e: WheelEvent) => {
      e.preventDefault();
      store.wheel(at(e), e.deltaMode === 1 ? e.deltaY * 33 : e.deltaY);
    };
    const menu = (e: MouseEvent) => e.preventDefault();
    el.addEventListener("pointerdown", down);
    el.addEventListener("pointermove", move);
    el.addEventListener("pointerup", up);
    el.addEventListener("pointercancel", cancel);
    el.addEventListener("wheel", wheel, { passive: false });
    el.addEventListener("contextmenu", menu);
    return () => {
      el.removeEventListener("pointerdown", down);
      el.removeEventListener("pointermove", move);
      el.removeEventListener("pointerup", up);
      el.removeEventListener("pointercancel", cancel);
      el.removeEventListener("wheel", wheel);
      el.removeEventListener("contextmenu", menu);
    };
  }, [store]);

  const { view, frameSize, stage } = s;
  return (
    <div
      ref={box}
      tabIndex={-1}
      data-testid="frame-viewer"
      data-frame={current?.frame ?? ""}
      data-cached-frames={cache.size}
      data-view={`${view.zoom} ${view.panX} ${view.panY}`}
      className="relative h-full w-full scroll-mt-28 touch-none overflow-hidden bg-[#101517] outline-none select-none"
      style={{ cursor: s.cursor }}
    >
      {stage.width > 0 && (
        <Stage width={stage.width} height={stage.height} listening={false}>
          <Layer
            listening={false}
            imageSmoothingEnabled={view.zoom < 2}
            onDraw={() => current && window.__lfFrameDrawn?.(current.frame)}
          >
            <Rect x={view.panX} y={view.panY} width={frameSize.width * view.zoom} height={frameSize.height * view.zoom} fill="#1b2326" />
            {current && <KImage image={current.img} x={view.panX} y={view.panY} width={frameSize.width * view.zoom} height={frameSize.height * view.zoom} opacity={stale ? 0.55 : 1} />}
            <Rect x={view.panX - 0.5} y={view.panY - 0.5} width={frameSize.width * view.zoom + 1} height={frameSize.height * view.zoom + 1} stroke="#3b474b" strokeWidth={1} />
            {/* One canvas for picture and overlays: they change together, and each extra canvas costs a composite. */}
            <CalibrationOverlay store={store} />
            <MarksOverlay store={store} />
            {extraOverlay}
          </Layer>
        </Stage>
      )}
      <ViewerHud store={store} loading={stale} />
    </div>
  );
}
