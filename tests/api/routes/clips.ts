import type { RouteCase } from "../route-table";

/** Rows of the policy table for this area (see tests/api/route-table.ts). */
export const clipsRoutes: RouteCase[] = [];
