export * from "./types";
export * from "./me";
export * from "./setActiveTeam";
export * from "./updatePrefs";
