// The team member entity on the client: its query keys.
export { memberKeys } from "./keys";
