import { useMemo } from "react";
import { frameTarget, usePlayback as usePlaybackInTime } from "@/components/shot/playback/usePlayback";
import type { DigitiseStore } from "../model/store";

/** Play the shot forward or back in capture time on its own frame clock, stopping at its ends. */
export function usePlayback(store: DigitiseStore) {
  const target = useMemo(() => {
    const st = store.getState();
    const get = () => ({ frame: store.getState().frame, first: st.frameStart, last: st.frameEnd });
    return frameTarget(st.clock, get, (f) => store.goto(f));
  }, [store]);
  return usePlaybackInTime(target, store.getState().captureFps);
}
export type { Playback } from "@/components/shot/playback/usePlayback";
