// Text a person types (names, titles, labels, venues, notes), checked the same way at every entry
// point: trimmed, capped in length, and refused when it carries characters no keyboard produces
// that still travel into rosters, lists, mails and PDFs:
//   - NUL and the other C0/C1 control characters (PostgreSQL refuses NUL in text outright; the
//     others break CSV cells, mail headers and terminals). Tab and line breaks only where the
//     field is multi-line.
//   - bidirectional overrides and isolates, U+202A–U+202E and U+2066–U+2069, which reorder what is
//     shown ("Trojan Source", CVE-2021-42574; Unicode Standard Annex #9, explicit directional
//     formatting characters).
//   - unpaired UTF-16 surrogates, which are not text at all (ECMAScript String.isWellFormed).
// Each refusal names the field in its message; the API answers it 422 with the field's path.
import { z } from "zod";

const BIDI_OVERRIDE = /[\u202a-\u202e\u2066-\u2069]/;
const LINE_BREAKS_AND_TAB = new Set([0x09, 0x0a, 0x0d]);

/** The first C0/C1 control character (or DEL) in `value`, as a code, or -1. */
function firstControl(value: string, multiline: boolean): number {
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i);
    if ((c < 0x20 || (c >= 0x7f && c <= 0x9f)) && !(multiline && LINE_BREAKS_AND_TAB.has(c))) return c;
  }
  return -1;
}
const hex = (c: number) => c.toString(16).toUpperCase().padStart(4, "0");

/** Sensible caps, so every form and route agrees. */
export const TEXT_LIMITS = { name: 100, title: 120, label: 80, short: 40, notes: 2000 } as const;

/** Why a string is not acceptable human text, or null when it is. */
export function unsafeTextProblem(value: string, multiline = false): string | null {
  const control = firstControl(value, multiline);
  if (control >= 0) return `contains a control character (U+${hex(control)})`;
  const bidi = BIDI_OVERRIDE.exec(value);
  if (bidi) return `contains a text-direction override character (U+${hex(bidi[0].charCodeAt(0))})`;
  if (!isWellFormed(value)) return "contains a broken character (an unpaired surrogate)";
  return null;
}

// String.prototype.isWellFormed is in Node 20 but not in every browser this client supports.
function isWellFormed(s: string): boolean {
  const w = s as string & { isWellFormed?: () => boolean };
  if (typeof w.isWellFormed === "function") return w.isWellFormed();
  return !/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/.test(s);
}

export interface HumanTextOptions {
  /** How the field is called in messages: "Name", "Venue", "The lie". */
  field: string;
  max: number;
  /** At least this many characters after trimming (default 0: may be empty). */
  min?: number;
  /** The message when shorter than `min`. */
  minMessage?: string;
  /** Tab and line breaks allowed (notes). */
  multiline?: boolean;
}

/** The one zod schema for human-entered text; every shared schema builds its text fields with it. */
export function humanText(o: HumanTextOptions) {
  let s = z.string({ error: `${o.field} must be text` }).trim();
  if (o.min) s = s.min(o.min, o.minMessage ?? `${o.field} must be at least ${o.min} character${o.min === 1 ? "" : "s"}`);
  return s.max(o.max, `${o.field} can be at most ${o.max} characters`).superRefine((v, ctx) => {
    const problem = unsafeTextProblem(v, o.multiline);
    if (problem) ctx.addIssue({ code: "custom", message: `${o.field} ${problem}` });
  });
}

/**
 * An id a client sends back (a person's or a team's id from the auth library; our own rows use
 * uuids): visible ASCII only, at most 100 characters, so a NUL or a megabyte never reaches a query.
 */
export function opaqueId(field: string, requiredMessage = `${field} is required`) {
  return z
    .string({ error: requiredMessage })
    .trim()
    .min(1, requiredMessage)
    .max(100, `${field} is not a valid id`)
    .regex(/^[\x21-\x7e]+$/, `${field} is not a valid id`);
}
