import { Fragment } from "react";
import { Circle, Group, Line, Text } from "react-konva";
import { LANDMARKS } from "@shared/schemas/shots";
import type { DigitiseStore } from "../model/store";
import { landmarkColour, landmarkTag } from "../model/style";
import { markAt, trailBefore } from "../model/tracks";
import { toScreen } from "../model/viewport";
import { useDigitise } from "./useDigitise";

const RING = 7;

/** Marks on the current frame (ring + centre dot + tag) and each landmark's trail of past marks. */
export function MarksOverlay({ store }: { store: DigitiseStore }) {
  const s = useDigitise(store, (st) => ({
    frame: st.frame, view: st.view, marks: st.doc.marks, visible: st.visible, trail: st.trail, active: st.activeLandmark,
    preview: st.preview, hover: st.hover, tool: st.tool,
  }));
  const dim = s.tool !== "mark";
  return (
    <Group opacity={dim ? 0.45 : 1}>
      {LANDMARKS.map((l) => {
        if (!s.visible[l]) return null;
        const colour = landmarkColour[l];
        const trail = trailBefore(s.marks[l], s.frame, s.trail).map((m) => toScreen(s.view, [m[1], m[2]]));
        const mark = markAt(s.marks[l], s.frame);
        const dragging = s.preview?.handle.kind === "mark" && s.preview.handle.landmark === l ? s.preview.at : null;
        const at = dragging ?? (mark ? ([mark[1], mark[2]] as [number, number]) : null);
        const p = at ? toScreen(s.view, at) : null;
        const isActive = l === s.active;
        const hovered = s.hover?.kind === "mark" && s.hover.landmark === l;
        return (
          <Fragment key={l}>
            {trail.length > 1 && <Line points={trail.flat()} stroke={colour} strokeWidth={1.25} opacity={0.55} lineJoin="round" />}
            {trail.map((q, i) => (
              <Circle key={i} x={q[0]} y={q[1]} radius={2.25} fill={colour} opacity={0.25 + (0.6 * (i + 1)) / trail.length} />
            ))}
            {p && (
              <Group x={p[0]} y={p[1]}>
                <Circle radius={RING + 2.5} stroke="#0b0f10" strokeWidth={3} opacity={0.55} />
                <Circle radius={RING} stroke={colour} strokeWidth={isActive || hovered ? 2.5 : 1.6} />
                <Line points={[-RING - 6, 0, -RING + 2, 0]} stroke={colour} strokeWidth={1} />
                <Line points={[RING - 2, 0, RING + 6, 0]} stroke={colour} strokeWidth={1} />
                <Line points={[0, -RING - 6, 0, -RING + 2]} stroke={colour} strokeWidth={1} />
                <Line points={[0, RING - 2, 0, RING + 6]} stroke={colour} strokeWidth={1} />
                <Circle radius={1.1} fill={colour} />
                <Text x={RING + 5} y={-RING - 13} text={landmarkTag[l]} fontSize={11} fontStyle="600" fontFamily="IBM Plex Sans, sans-serif" fill={colour} shadowColor="#000" shadowBlur={3} shadowOpacity={0.9} />
              </Group>
            )}
          </Fragment>
        );
      })}
    </Group>
  );
}
