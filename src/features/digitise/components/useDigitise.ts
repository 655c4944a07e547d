import { useCallback, useRef, useSyncExternalStore } from "react";
import type { DigitiseState, DigitiseStore } from "../model/store";

function shallowEqual(a: unknown, b: unknown): boolean {
  if (Object.is(a, b)) return true;
  if (typeof a !== "object" || typeof b !== "object" || !a || !b) return false;
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  return ka.every((k) => Object.is((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

/** A slice of the store; re-renders only when the slice changes (shallowly). */
export function useDigitise<T>(store: DigitiseStore, select: (s: DigitiseState) => T): T {
  const last = useRef<{ value: T } | null>(null);
  const get = useCallback(() => {
    const next = select(store.getState());
    if (last.current && shallowEqual(last.current.value, next)) return last.current.value;
    last.current = { value: next };
    return next;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [store]);
  return useSyncExternalStore(store.subscribe, get, get);
}
