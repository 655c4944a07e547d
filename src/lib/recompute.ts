// Results recomputed on the server's job queue (a clip's calibration or a stick's stiffness
// changed) arrive a moment after the change: pages that show them look again at this pace while
// the server says "recomputing", and stop as soon as it does not.
import { useEffect, useRef } from "react";

export const RECOMPUTE_POLL_MS = 1500;

/**
 * While `stored` says recomputing, fetches the shot again every RECOMPUTE_POLL_MS and hands its
 * stored result on; stops when the new one is there or the page goes.
 */
export function useRecomputedResult<R extends { recomputing: boolean }>(stored: R | null, fetchLatest: () => Promise<{ storedResult: R | null }>, onResult: (r: R) => void) {
  const recomputing = !!stored?.recomputing;
  // The latest callbacks, read at each tick, so a new render does not restart the timer.
  const latest = useRef({ fetchLatest, onResult });
  useEffect(() => {
    latest.current = { fetchLatest, onResult };
  });
  useEffect(() => {
    if (!recomputing) return;
    let stopped = false;
    const timer = setInterval(() => {
      latest.current.fetchLatest().then(
        (fresh) => {
          if (!stopped && fresh.storedResult && !fresh.storedResult.recomputing) latest.current.onResult(fresh.storedResult);
        },
        () => undefined, // the next tick tries again
      );
    }, RECOMPUTE_POLL_MS);
    return () => {
      stopped = true;
      clearInterval(timer);
    };
  }, [recomputing]);
}
