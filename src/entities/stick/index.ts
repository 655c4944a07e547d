// The stick entity on the client: its query-key tree and what a change to a stick invalidates.
export { stickKeys, stickPath } from "./keys";
export { stickChanged } from "./invalidate";
