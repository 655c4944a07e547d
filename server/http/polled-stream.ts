import type { Request, Response } from "express";

/** What a polled Server-Sent Events stream reads and says. */
export interface PolledStream<T> {
  /** Reads the current state; null when the thing is gone. */
  read: () => Promise<T | null>;
  /** Event name for each changed state, and for "nothing there" (which ends the stream). */
  event: string;
  missingEvent: string;
  /** The event's data; the stream writes only when its JSON changes. */
  present: (state: T) => unknown;
  /** True once the state is final: it is sent, then the stream ends. */
  finished: (state: T) => boolean;
  intervalMs: number;
}

/** Proxies drop a silent connection; a comment line every 15 s keeps it open. */
const HEARTBEAT_MS = 15_000;

/**
 * Server-Sent Events from polling the database: an event on every change, ending at the final
 * state or when the client leaves. Polling, not notifications, so any web process can serve it
 * whichever process or worker does the work. An error mid-stream reaches the problem handler,
 * which closes the connection (the client sees a broken answer, not an open one).
 */
export async function streamPolled<T>(req: Request, res: Response, s: PolledStream<T>): Promise<void> {
  res.status(200).set({ "Content-Type": "text/event-stream", "Cache-Control": "no-store", Connection: "keep-alive", "X-Accel-Buffering": "no" });
  res.flushHeaders();
  let closed = false;
  req.on("close", () => (closed = true));
  let last = "";
  let beat = Date.now();
  while (!closed) {
    const state = await s.read();
    if (!state) {
      res.write(`event: ${s.missingEvent}\ndata: {}\n\n`);
      break;
    }
    const data = JSON.stringify(s.present(state));
    if (data !== last) {
      res.write(`event: ${s.event}\ndata: ${data}\n\n`);
      last = data;
      beat = Date.now();
    } else if (Date.now() - beat > HEARTBEAT_MS) {
      res.write(`: still working\n\n`);
      beat = Date.now();
    }
    if (s.finished(state)) break;
    await new Promise((r) => setTimeout(r, s.intervalMs));
  }
  res.end();
}
