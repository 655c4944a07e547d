// The tracking assist core: pure TypeScript over grayscale frames, for the browser worker and Node.
export * from "./types";
export * from "./errors";
export { track, type TrackDeps } from "./track";
export { DEFAULTS as TRACK_DEFAULTS } from "./validate";
export { createCvMatcher, type Matcher, type Rect, type ScoreMap } from "./matcher";
export { loadOpenCv, provideOpenCv, type OpenCv } from "./opencv";
export { findPeak, type Peak } from "./peak";
