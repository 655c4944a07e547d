import { Group, Rect, Text } from "react-konva";
import type { TrackingProposals } from "@shared/schemas/tracking";
import { pendingAt } from "../model/proposals";
import type { DigitiseStore } from "../model/store";
import { landmarkColour, landmarkTag } from "../model/style";
import { toScreen } from "../model/viewport";
import { useDigitise } from "./useDigitise";

/** A tracking run's proposals on this frame, not yet accepted: hollow diamonds, never the rings of marks. */
export function ProposalsOverlay({ store, proposals }: { store: DigitiseStore; proposals: TrackingProposals | null }) {
  const s = useDigitise(store, (st) => ({ view: st.view, frame: st.frame, marks: st.doc.marks, visible: st.visible }));
  if (!proposals) return null;
  const here = pendingAt(proposals, s.marks, s.frame).filter((q) => s.visible[q.landmark]);
  return (
    <Group listening={false}>
      {here.map((q) => {
        const [x, y] = toScreen(s.view, [q.x, q.y]);
        const c = landmarkColour[q.landmark];
        return (
          <Group key={q.landmark} x={x} y={y}>
            <Rect width={12} height={12} offsetX={6} offsetY={6} rotation={45} stroke={c} strokeWidth={1.75} dash={[3, 2]} shadowColor="#000" shadowBlur={2} shadowOpacity={0.8} />
            <Text x={10} y={-16} text={`${landmarkTag[q.landmark]} ${Math.round(q.confidence * 100)}%`} fontSize={11} fill={c} fontFamily="IBM Plex Sans, sans-serif" shadowColor="#000" shadowBlur={3} shadowOpacity={0.9} />
          </Group>
        );
      })}
    </Group>
  );
}
