import { redirect, type LoaderFunctionArgs } from "react-router-dom";
import { meQueryOptions } from "@/lib/session";
import { queryClient } from "./query-client";

/** Where sign-in sends people back to; only paths inside this app, never another site. */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return "/";
  if (next.startsWith("/sign-in")) return "/";
  return next;
}

export const signInUrl = (next: string) => (next === "/" ? "/sign-in" : `/sign-in?next=${encodeURIComponent(next)}`);

/** Loader of the signed-in layout: no session → /sign-in?next=<where they wanted to go>. */
export async function requireSession({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (!me) {
    const url = new URL(request.url);
    throw redirect(signInUrl(url.pathname + url.search));
  }
  return null;
}

/** Loader of the sign-in page: already signed in → straight on. */
export async function redirectIfSignedIn({ request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me) throw redirect(safeNext(new URL(request.url).searchParams.get("next")));
  return null;
}
