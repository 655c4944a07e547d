// The shot entity on the client: its query-key tree and what a change to shots invalidates.
export { shotKeys } from "./keys";
export { fetchShots, shotsQueryOptions, useShots } from "./list";
export { shotAccessChanged, shotMarksSaved, shotsChanged } from "./invalidate";
