// The clip entity on the client: its query-key tree and what a change to a clip invalidates.
export { clipKeys, clipPath } from "./keys";
export { clipChanged } from "./invalidate";
export { clipOptionsQueryOptions, fetchClipOptions, useClipOptions } from "./options";
