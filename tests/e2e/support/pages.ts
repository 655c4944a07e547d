// The main pages of the app for one signed-in person, with the demo club's records filled in
// (found through the API as that person sees it), for the screen-size and accessibility sweeps.
import type { Page } from "@playwright/test";

export interface Sizes {
  name: "desktop" | "tablet" | "phone";
  width: number;
  height: number;
}

export const SIZES: Sizes[] = [
  { name: "desktop", width: 1366, height: 850 },
  { name: "tablet", width: 1024, height: 768 },
  { name: "phone", width: 390, height: 844 },
];

async function json<T>(page: Page, path: string): Promise<T> {
  const r = await page.request.get(path);
  if (!r.ok()) throw new Error(`${path} answered ${r.status()}`);
  return (await r.json()) as T;
}

/** Paths of the main pages this person can open, each with a record of the active team. */
export async function mainPages(page: Page): Promise<string[]> {
  const me = await json<{ activeTeamId: string; teams: { id: string; role: string }[] }>(page, "/api/me");
  const t = me.activeTeamId;
  const role = me.teams.find((x) => x.id === t)?.role;
  const staff = role !== "player";
  const { items: clips } = await json<{ items: { id: string; status: string }[] }>(page, `/api/teams/${t}/clips?pageSize=50`);
  const { shots } = await json<{ shots: { id: string; clipId: string; hasResults: boolean }[] }>(page, `/api/teams/${t}/readout/shots`);
  const { sticks } = await json<{ sticks: { id: string; latest: { benchTestId: string } | null }[] }>(page, `/api/teams/${t}/sticks`);
  const clip = clips.find((c) => c.status === "ready");
  const withResults = shots.filter((s) => s.hasResults);
  const stick = sticks.find((s) => s.latest);
  const paths = ["/", "/readout", "/progress", "/settings", "/sticks"];
  if (clip) paths.push(`/clips/${clip.id}`, `/clips/${clip.id}/shots`);
  if (withResults[0]) paths.push(`/readout/${withResults[0].id}`, `/clips/${withResults[0].clipId}/shots/${withResults[0].id}/digitise`);
  if (withResults[1]) paths.push(`/compare?a=${withResults[0].id}&b=${withResults[1].id}`);
  if (stick) paths.push(`/sticks/${stick.id}`, `/sticks/${stick.id}/bench-tests/${stick.latest!.benchTestId}`);
  if (staff) {
    paths.push("/clips");
    if (stick) paths.push(`/sticks/${stick.id}/beam`, `/sticks/${stick.id}/bench-tests/new`);
  }
  if (role === "admin") paths.push("/roster", "/audit", "/billing");
  return paths;
}

/** Open a page and wait until its data has arrived (no request in flight, no spinner). */
export async function openSettled(page: Page, path: string) {
  await page.goto(path);
  // The Digitise page keeps fetching frames ahead; a few quiet moments are enough elsewhere.
  await page.waitForLoadState("networkidle", { timeout: 8_000 }).catch(() => {});
  await page.locator('[aria-busy="true"], [role="status"]:has-text("Loading")').first().waitFor({ state: "detached", timeout: 10_000 }).catch(() => {});
}
