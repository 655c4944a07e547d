import type { z } from "zod";
import { zodToHttp } from "./problem";

/** Parse with a shared zod schema; a failure becomes a 422 problem naming the field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  const r = schema.safeParse(value);
  if (!r.success) throw zodToHttp(r.error);
  return r.data;
}
