import { Circle, Group, Line, Text } from "react-konva";
import { lengthToMm } from "@shared/schemas/shots";
import type { CalDraft } from "../model/calibration-draft";
import type { DigitiseStore } from "../model/store";
import { calibrationColour, calibrationDraftColour } from "../model/style";
import { toScreen, type Vec2 } from "../model/viewport";
import { useDigitise } from "./useDigitise";

const label = { fontSize: 11, fontFamily: "IBM Plex Sans, sans-serif", shadowColor: "#000", shadowBlur: 3, shadowOpacity: 0.95 } as const;

/** The scale bar (with its end ticks and mm per px) or the plane's numbered points and outline. */
export function CalibrationOverlay({ store }: { store: DigitiseStore }) {
  const s = useDigitise(store, (st) => ({ view: st.view, cal: st.doc.calibration, tool: st.tool, preview: st.preview, hover: st.hover }));
  const cal = s.cal;
  if (!cal) return null;
  const editing = s.tool === cal.type;
  const colour = editing ? calibrationDraftColour : calibrationColour;
  const at = (p: Vec2, h: { kind: "scaleBar"; end: "a" | "b" } | { kind: "plane"; index: number }) => {
    const pv = s.preview?.handle;
    const dragged = pv && pv.kind === h.kind && (pv.kind === "scaleBar" ? pv.end === (h as { end: string }).end : pv.index === (h as { index: number }).index);
    return toScreen(s.view, dragged ? s.preview!.at : p);
  };
  return <Group opacity={editing ? 1 : 0.8}>{cal.type === "scaleBar" ? <ScaleBar cal={cal} at={at} colour={colour} editing={editing} /> : <Plane cal={cal} at={at} colour={colour} />}</Group>;
}

type At = (p: Vec2, h: { kind: "scaleBar"; end: "a" | "b" } | { kind: "plane"; index: number }) => Vec2;

/**
 * While editing: the bar on its two points, with handles. Otherwise drawn like a dimension on a
 * drawing, offset from the points with extension lines, so it never covers what it measured.
 */
function ScaleBar({ cal, at, colour, editing }: { cal: Extract<CalDraft, { type: "scaleBar" }>; at: At; colour: string; editing: boolean }) {
  const a = cal.a ? at(cal.a, { kind: "scaleBar", end: "a" }) : null;
  const b = cal.b ? at(cal.b, { kind: "scaleBar", end: "b" }) : null;
  if (!a) return null;
  if (!b || !cal.a || !cal.b) return <Circle x={a[0]} y={a[1]} radius={4} stroke={colour} strokeWidth={1.5} />;
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy) || 1;
  // The normal that points up the screen.
  let n: Vec2 = [-dy / len, dx / len];
  if (n[1] > 0) n = [-n[0], -n[1]];
  const off = editing ? 0 : 18;
  const a2: Vec2 = [a[0] + n[0] * off, a[1] + n[1] * off];
  const b2: Vec2 = [b[0] + n[0] * off, b[1] + n[1] * off];
  const tick = (p: Vec2) => [p[0] - n[0] * 6, p[1] - n[1] * 6, p[0] + n[0] * 6, p[1] + n[1] * 6];
  const px = Math.hypot(cal.b[0] - cal.a[0], cal.b[1] - cal.a[1]);
  const text = `${cal.length} ${cal.unit} · ${(lengthToMm(cal.length, cal.unit) / px).toFixed(3)} mm/px`;
  const mid: Vec2 = [(a2[0] + b2[0]) / 2 + n[0] * 8, (a2[1] + b2[1]) / 2 + n[1] * 8];
  return (
    <Group>
      {!editing &&
        [a, b].map((p, i) => <Line key={i} points={[p[0] + n[0] * 4, p[1] + n[1] * 4, p[0] + n[0] * (off + 6), p[1] + n[1] * (off + 6)]} stroke={colour} strokeWidth={1} opacity={0.8} />)}
      <Line points={[...a2, ...b2]} stroke="#000" strokeWidth={3.5} opacity={0.45} />
      <Line points={[...a2, ...b2]} stroke={colour} strokeWidth={1.25} dash={editing ? [6, 3] : undefined} />
      <Line points={tick(a2)} stroke={colour} strokeWidth={1.5} />
      <Line points={tick(b2)} stroke={colour} strokeWidth={1.5} />
      {editing && [a, b].map((p, i) => <Circle key={i} x={p[0]} y={p[1]} radius={4} stroke={colour} strokeWidth={1.5} />)}
      <Text x={mid[0]} y={mid[1] - 12} text={text} fill={colour} {...label} />
    </Group>
  );
}

function Plane({ cal, at, colour }: { cal: Extract<CalDraft, { type: "plane" }>; at: At; colour: string }) {
  const pts = cal.points.map((p, index) => at(p.image, { kind: "plane", index }));
  return (
    <Group>
      {pts.length > 1 && <Line points={pts.flat()} closed={pts.length > 2} stroke={colour} strokeWidth={1.25} dash={[5, 4]} />}
      {pts.map((p, i) => {
        const w = cal.points[i].world;
        return (
          <Group key={i} x={p[0]} y={p[1]}>
            <Circle radius={5} stroke={colour} strokeWidth={1.5} />
            <Circle radius={1} fill={colour} />
            <Text x={7} y={-16} text={`${i + 1}${w ? ` (${w[0]}, ${w[1]}) mm` : " — type its position"}`} fill={w ? colour : "#ffb199"} {...label} />
          </Group>
        );
      })}
    </Group>
  );
}
