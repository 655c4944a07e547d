// The shot mechanics engine: pure functions, no I/O, no clock; randomness only from seeds.
export * from "./errors";
export * from "./version";
export * from "./homography";
export * from "./calibration";
export * from "./butterworth";
export * from "./residual-analysis";
export * from "./track-smoothing";
export * from "./line-fit";
export * from "./bend";
export * from "./stored-energy";
export * from "./uncertainty";
export * from "./plausibility";
export * from "./validate-shot";
export * from "./compute-shot";
export * from "../schemas/shot-document";
export * from "../schemas/shot-results";
export * from "./synthetic-shot";
