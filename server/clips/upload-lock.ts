// The resumable-upload lock, shared by every web process through PostgreSQL, so that any process
// can serve any request of an upload (decision 170). tus asks for a lock around each request that
// reads or writes an upload (HEAD, PATCH, DELETE); the protocol wants a newer request to win: the
// holder is asked to let go (tus cancels it after its drain time) and the newcomer waits.
//
// - Exclusion between processes: a session-level advisory lock (PostgreSQL manual §13.3.5) held
//   on one connection per process, so a process that dies frees its locks with its connection.
// - Exclusion inside a process: a map, because advisory locks are re-entrant for one session.
// - "Let go": NOTIFY on one channel; every process LISTENs on its lock connection and asks its
//   own holder of that upload to release.
import { createHash } from "node:crypto";
import pg from "pg";
import { ERRORS, type Lock, type Locker, type RequestRelease } from "@tus/utils";
import { log } from "../log";
import { inTurn } from "../db/in-turn";

const CHANNEL = "tus_upload_release";
/** First key of the two-key advisory lock space (PostgreSQL keeps it apart from one-key locks). */
const LOCK_SPACE = 0x7475_7301; // "tus" + 1
const POLL_MS = 100;

interface Holder {
  /** Asks the request holding (or acquiring) the lock to stop. */
  requestRelease: RequestRelease;
  /** The connection whose session holds the advisory lock, once it does. */
  heldOn?: pg.Client;
  released: Promise<void>;
  release: () => void;
}

/** An upload id → the second lock key: 32 bits of its SHA-256 (ids are random; collisions only serialise). */
export function lockKey(id: string): number {
  return createHash("sha256").update(id).digest().readInt32BE(0);
}

const sleep = (ms: number, signal: AbortSignal) =>
  new Promise<void>((resolve) => {
    const t = setTimeout(done, Math.max(0, ms));
    signal.addEventListener("abort", done, { once: true });
    function done() {
      clearTimeout(t);
      signal.removeEventListener("abort", done);
      resolve();
    }
  });

const isTusError = (err: unknown) => !!err && typeof err === "object" && "status_code" in err;

export class PgUploadLocker implements Locker {
  private holders = new Map<string, Holder>();
  /** The one lock connection every upload in progress shares: its queries take their turn (inTurn). */
  private conn: Promise<pg.Client> | undefined;

  constructor(
    private readonly url: string,
    /** How long a request waits for the lock before answering an error (tus's own default). */
    readonly acquireTimeoutMs = 30_000,
  ) {}

  newLock(id: string): Lock {
    let mine: Holder | undefined;
    return {
      lock: async (signal, requestRelease) => {
        mine = await this.acquire(id, signal, requestRelease);
      },
      unlock: async () => {
        if (mine) await this.release(id, mine);
        mine = undefined;
      },
    };
  }

  /** Closes the lock connection (its advisory locks go with it). */
  async close(): Promise<void> {
    const c = this.conn;
    this.conn = undefined;
    if (c) await (await c).end().catch(() => {});
  }

  private client(): Promise<pg.Client> {
    const mine: Promise<pg.Client> = (this.conn ??= (async () => {
      const c = new pg.Client({ connectionString: this.url, connectionTimeoutMillis: 5_000, query_timeout: 10_000 });
      const lost = (err?: Error) => {
        if (this.conn !== mine) return;
        this.conn = undefined;
        log.warn({ err }, "upload lock connection lost; uploads in progress are asked to resume");
        // The advisory locks went with the connection: no holder is exclusive any more.
        for (const h of this.holders.values()) if (h.heldOn === c) void h.requestRelease();
      };
      c.on("error", lost);
      c.on("end", () => lost());
      c.on("notification", (n) => {
        const h = n.payload ? this.holders.get(n.payload) : undefined;
        if (h?.heldOn) void h.requestRelease();
      });
      await c.connect();
      await inTurn(c, `listen ${CHANNEL}`);
      return c;
    })());
    mine.catch(() => {
      if (this.conn === mine) this.conn = undefined;
    });
    return mine;
  }

  private async acquire(id: string, signal: AbortSignal, requestRelease: RequestRelease): Promise<Holder> {
    const deadline = Date.now() + this.acquireTimeoutMs;
    const gaveUp = () => signal.aborted || Date.now() > deadline;

    // 1. This process: ask our own current holder to let go, and wait for it.
    for (let other = this.holders.get(id); other; other = this.holders.get(id)) {
      await other.requestRelease();
      await Promise.race([other.released, sleep(deadline - Date.now(), signal)]);
      if (gaveUp() && this.holders.get(id)) throw signal.aborted ? ERRORS.ABORTED : ERRORS.ERR_LOCK_TIMEOUT;
    }
    let release!: () => void;
    const mine: Holder = { requestRelease, released: new Promise<void>((r) => (release = r)), release };
    this.holders.set(id, mine);

    // 2. Every other process: the advisory lock; whoever holds it is asked once to let go.
    const key = lockKey(id);
    let asked = false;
    try {
      for (;;) {
        const c = await this.client();
        const r = await inTurn<{ ok: boolean }>(c, "select pg_try_advisory_lock($1, $2) as ok", [LOCK_SPACE, key]);
        if (r.rows[0].ok) {
          mine.heldOn = c;
          if (signal.aborted) throw ERRORS.ABORTED;
          return mine;
        }
        if (!asked) {
          await inTurn(c, "select pg_notify($1, $2)", [CHANNEL, id]);
          asked = true;
        }
        if (gaveUp()) throw signal.aborted ? ERRORS.ABORTED : ERRORS.ERR_LOCK_TIMEOUT;
        await sleep(POLL_MS, signal);
      }
    } catch (err) {
      await this.release(id, mine);
      if (!isTusError(err)) log.warn({ err, uploadId: id }, "upload lock: could not reach PostgreSQL");
      throw isTusError(err) ? err : ERRORS.ERR_LOCK_TIMEOUT;
    }
  }

  private async release(id: string, h: Holder): Promise<void> {
    if (this.holders.get(id) === h) this.holders.delete(id);
    try {
      // Only the session that took it can free it; a lost connection already did.
      if (h.heldOn && this.conn && (await this.conn) === h.heldOn) await inTurn(h.heldOn, "select pg_advisory_unlock($1, $2)", [LOCK_SPACE, lockKey(id)]);
    } catch (err) {
      log.warn({ err, uploadId: id }, "upload lock: unlock failed (the connection's locks are gone with it)");
    } finally {
      h.heldOn = undefined;
      h.release();
    }
  }
}
