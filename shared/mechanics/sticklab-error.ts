// One error type for bad stick-lab input, so the CLI can print it as one line and the API can
// answer 400 with it, without either having to know which part of the engine refused.

export interface StickLabErrorPlace {
  /** Input field the problem is in, e.g. "supportsMm" or "deflection_in". */
  field?: string;
  /** 1-based row: a CSV line number (header = 1) or a table row. */
  row?: number;
}

export class StickLabInputError extends Error {
  readonly field?: string;
  readonly row?: number;

  constructor(message: string, place: StickLabErrorPlace = {}) {
    super(message);
    this.name = "StickLabInputError";
    this.field = place.field;
    this.row = place.row;
  }
}
