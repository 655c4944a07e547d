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
  return <Group opacity={editing ? 1 : 0.8}>{cal.type === "scaleBar" ? <ScaleBar cal={cal} at={at} colour={colour} /> : <Plane cal={cal} at={at} colour={colour} />}</Group>;
}

type At = (p: Vec2, h: { kind: "scaleBar"; end: "a" | "b" } | { kind: "plane"; index: number }) => Vec2;

function ScaleBar({ cal, at, colour }: { cal: Extract<CalDraft, { type: "scaleBar" }>; at: At; colour: string }) {
  const a = cal.a ? at(cal.a, { kind: "scaleBar", end: "a" }) : null;
  const b = cal.b ? at(cal.b, { kind: "scaleBar", end: "b" }) : null;
  if (!a) return null;
  const ends = [a, ...(b ? [b] : [])];
  let tick: number[][] = [];
  let text = "";
  if (b && cal.a && cal.b) {
    const dx = b[0] - a[0];
    const dy = b[1] - a[1];
    const len = Math.hypot(dx, dy) || 1;
    const n = [-dy / len, dx / len];
    tick = ends.map((p) => [p[0] - n[0] * 9, p[1] - n[1] * 9, p[0] + n[0] * 9, p[1] + n[1] * 9]);
    const px = Math.hypot(cal.b[0] - cal.a[0], cal.b[1] - cal.a[1]);
    const mm = lengthToMm(cal.length, cal.unit);
    text = `${cal.length} ${cal.unit} · ${(mm / px).toFixed(3)} mm/px`;
  }
  const mid = b ? [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2] : a;
  return (
    <Group>
      {b && <Line points={[...a, ...b]} stroke="#000" strokeWidth={4} opacity={0.5} />}
      {b && <Line points={[...a, ...b]} stroke={colour} strokeWidth={1.5} dash={[6, 3]} />}
      {tick.map((t, i) => (
        <Line key={i} points={t} stroke={colour} strokeWidth={1.5} />
      ))}
      {ends.map((p, i) => (
        <Circle key={i} x={p[0]} y={p[1]} radius={4} stroke={colour} strokeWidth={1.5} />
      ))}
      {text && <Text x={mid[0] + 8} y={mid[1] + 10} text={text} fill={colour} {...label} />}
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
