// Row ids in paths are uuids. One that is not names nothing: answer 404 before asking PostgreSQL
// (which would refuse the cast), so every other failure of a lookup stays what it is.
import { notFound } from "./problem";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const isUuid = (v: string) => UUID.test(v);

/** The id when it is a uuid, else the 404 for `what` ("That clip"). */
export function uuidOr404(v: string, what: string): string {
  if (!UUID.test(v)) throw notFound(what);
  return v;
}
