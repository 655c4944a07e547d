// Each web process keeps the answers of the hot reads it made last, with the team's change stamp
// each was made at (docs/decisions/192-answer-cache-with-a-change-stamp.md). The read's own
// statement still checks membership and reads the current stamp every time; it sends the data only
// when the stamp differs from the one held, so a repeated read answers with the kept bytes.
// An answer is kept from its ask's second read on (docs/decisions/200-keep-answers-asked-twice.md):
// keeping every first read cost more CPU than the kept reads saved.
import { LRUCache } from "lru-cache";
import { weakTag } from "./json-answer";
import type { Actor } from "../auth/policy";

/**
 * An answer as sent: its JSON text as UTF-8 bytes (encoded once, not on every send: one shot's
 * readout is ~80 kB), its ETag, and the stamp of the team it was made at.
 */
export interface KeptAnswer {
  stamp: string;
  body: Buffer;
  tag: string;
}

/** Bytes one cache may hold: a few hundred readouts. */
export const ANSWER_CACHE_BYTES = 32 * 1024 * 1024;
/** Asks read once that a cache remembers (their keys only), so a second read of one is kept. */
export const ASKED_ONCE_KEYS = 8192;

/**
 * The key of everything an answer depends on besides the stored data: the team, the person and
 * the role they read as (a player's answers are their own; staff's depend on the role), and what
 * they asked for, after validation.
 */
export const answerKey = (a: Actor, asked: unknown) => `${a.teamId}\u0000${a.userId}\u0000${a.role}\u0000${JSON.stringify(asked)}`;

/**
 * One hot read's kept answers, bounded by their size. An answer is kept only when its ask was
 * read before (or is kept already): each kept answer's bytes live outside V8's heap, and a stream
 * of asks read once each (every shot of a season opened one time) made V8 run a full collection
 * every few hundred milliseconds for the bytes it kept and dropped, about 0.5 ms of CPU a read.
 */
export function answerCache(maxBytes = ANSWER_CACHE_BYTES, askedOnceKeys = ASKED_ONCE_KEYS) {
  const kept = new LRUCache<string, KeptAnswer>({ maxSize: maxBytes, sizeCalculation: (v, k) => v.body.length + 2 * (v.tag.length + v.stamp.length + k.length) + 64 });
  const askedOnce = new LRUCache<string, true>({ max: askedOnceKeys });
  function keepBytes(key: string, stamp: string, body: Buffer, tag: string): KeptAnswer {
    const a = { stamp, body, tag };
    if (kept.has(key) || askedOnce.delete(key)) kept.set(key, a);
    else askedOnce.set(key, true);
    return a;
  }
  return {
    /** The answer kept under this key, if any; pass its stamp to the read's statement. */
    known: (key: string): KeptAnswer | undefined => kept.get(key),
    /** A fresh answer (made at `stamp`), kept when its ask was read before; returns it. */
    keep: (key: string, stamp: string, text: string, tag = weakTag(text)): KeptAnswer => keepBytes(key, stamp, Buffer.from(text), tag),
    /** The same for an answer already in its UTF-8 bytes, with the ETag of its text. */
    keepBytes,
    /** What the cache holds: entries and bytes (for the tests and the bench). */
    size: () => ({ entries: kept.size, bytes: kept.calculatedSize }),
  };
}

