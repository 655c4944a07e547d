/** Path of the offending field inside a shot document, e.g. ["tracks", "puck", 3]. */
export type InputPath = (string | number)[];

/** "tracks.puck[3][1]" from ["tracks", "puck", 3, 1]. */
export function formatPath(path: InputPath): string {
  let out = "";
  for (const seg of path) {
    if (typeof seg === "number") out += `[${seg}]`;
    else out += out ? `.${seg}` : seg;
  }
  return out;
}

/**
 * Bad input to the engine: the document cannot give trustworthy results, so nothing may be stored.
 * `message` is one line that names the field; `detail` is the same without the field, for showing
 * next to it in a form.
 */
export class MechanicsInputError extends Error {
  readonly code = "MECHANICS_INPUT";
  readonly path: string;
  readonly pathSegments: InputPath;
  readonly detail: string;

  constructor(pathSegments: InputPath, detail: string) {
    const path = formatPath(pathSegments);
    super(path ? `${path}: ${detail}` : detail);
    this.name = "MechanicsInputError";
    this.path = path;
    this.pathSegments = pathSegments;
    this.detail = detail;
  }
}

export function isMechanicsInputError(e: unknown): e is MechanicsInputError {
  return e instanceof MechanicsInputError;
}
