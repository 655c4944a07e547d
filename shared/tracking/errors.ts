/** A request the tracker cannot run: `field` names the offending option, `message` says why in one line. */
export class TrackInputError extends Error {
  readonly code = "TRACK_INPUT";
  constructor(
    readonly field: string,
    readonly detail: string,
  ) {
    super(`${field}: ${detail}`);
    this.name = "TrackInputError";
  }
}

export function isTrackInputError(e: unknown): e is TrackInputError {
  return e instanceof TrackInputError;
}
