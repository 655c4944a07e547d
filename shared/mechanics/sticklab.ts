// Stick lab engine: readings, bench fit, flex normalisation, beam model. Pure; runs in the page,
// the API and the CLI alike.
export * from "./sticklab-error";
export * from "./readings-csv";
export * from "./bench-fit-line";
export * from "./bench-fit-flags";
export * from "./bench-fit-normalise";
export * from "./bench-fit";
export * from "./bench-fit-history";
export * from "./beam-input";
export * from "./beam";
export * from "./beam-from-shot";
