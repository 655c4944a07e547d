// Whether the server now serves a newer build of the pages than the one running in this tab. A tab
// left open across an update would keep calling the new API with its old code (e.g. drawing empty
// charts for results stored in a newer shape), and its lazily loaded pages are gone from the
// server (decision 203).

import { CLIENT_BUILD_HEADER } from "@shared/client-build";

let stale = false;
const listeners = new Set<() => void>();

/** The entry script this tab was loaded with (the built index.html's module script); null in development. */
function ownBuild(): string | null {
  return document.querySelector<HTMLScriptElement>('script[type="module"][src^="/assets/"]')?.getAttribute("src") ?? null;
}

/** Notes the build an API answer names, if any: another one than this tab's means the tab is out of date. */
export function noteServerBuild(res: Response) {
  const theirs = res.headers.get(CLIENT_BUILD_HEADER);
  if (stale || !theirs) return;
  const mine = ownBuild();
  if (mine && theirs !== mine) markOutOfDate();
}

/** This tab runs an older build than the server's (also when a lazily loaded page of it is gone). */
export function markOutOfDate() {
  if (stale) return;
  stale = true;
  for (const l of listeners) l();
}

export const subscribeOutOfDate = (l: () => void) => {
  listeners.add(l);
  return () => void listeners.delete(l);
};
export const isOutOfDate = () => stale;
