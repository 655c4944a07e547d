// A tiny toast queue outside React, so the query client's global error handlers can raise
// toasts too. Components read it through useSyncExternalStore (see Toaster).

export type ToastTone = "error" | "success" | "info";

export interface Toast {
  id: number;
  tone: ToastTone;
  title?: string;
  message: string;
}

type Listener = () => void;

let toasts: Toast[] = [];
let nextId = 1;
const listeners = new Set<Listener>();
const timers = new Map<number, ReturnType<typeof setTimeout>>();
const MAX_VISIBLE = 4;
const LIFETIME_MS: Record<ToastTone, number> = { error: 9000, success: 4500, info: 6000 };

function emit() {
  for (const l of listeners) l();
}

export function dismissToast(id: number) {
  const t = timers.get(id);
  if (t) clearTimeout(t);
  timers.delete(id);
  toasts = toasts.filter((x) => x.id !== id);
  emit();
}

function push(tone: ToastTone, message: string, title?: string): number {
  // The same failure reported twice in a row (e.g. by two queries) shows once.
  const same = toasts.find((x) => x.tone === tone && x.message === message && x.title === title);
  if (same) return same.id;
  const id = nextId++;
  toasts = [...toasts, { id, tone, message, title }].slice(-MAX_VISIBLE);
  timers.set(id, setTimeout(() => dismissToast(id), LIFETIME_MS[tone]));
  emit();
  return id;
}

export const toast = {
  error: (message: string, title?: string) => push("error", message, title),
  success: (message: string, title?: string) => push("success", message, title),
  info: (message: string, title?: string) => push("info", message, title),
};

export function subscribeToasts(l: Listener) {
  listeners.add(l);
  return () => listeners.delete(l);
}

export const getToasts = () => toasts;
