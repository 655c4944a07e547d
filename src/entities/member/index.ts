// The team member entity on the client: its query keys and the roster it is read from.
export { memberKeys } from "./keys";
export { fetchRoster, rosterQueryOptions, useMemberNames, useRoster, type Invitation, type Member, type Roster } from "./roster";
