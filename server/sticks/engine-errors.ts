// The engine refuses bad input with StickLabInputError; the API answers it as a 422 naming the
// field (and the file line or table row the message already names), like any other validation.
import { StickLabInputError } from "../../shared/mechanics/sticklab";
import { HttpError } from "../http/problem";

export function engineInputError(err: StickLabInputError, field = err.field ?? "input"): HttpError {
  return new HttpError(422, "validation_failed", err.message, [{ path: field, message: err.message }]);
}

/** Runs an engine call; its input errors become 422s, anything else is a real fault and passes on. */
export function viaEngine<T>(run: () => T, field?: string): T {
  try {
    return run();
  } catch (err) {
    if (err instanceof StickLabInputError) throw engineInputError(err, field ?? err.field);
    throw err;
  }
}
