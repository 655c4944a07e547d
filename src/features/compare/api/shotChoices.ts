import { useQuery } from "@tanstack/react-query";
import { SHOTS_PAGE_MAX } from "@shared/schemas/readout";
import { shotsQueryOptions } from "@/entities/shot";

/**
 * The shots one may put side by side: the Shots list's newest SHOTS_PAGE_MAX. Older ones are
 * reached from the Shots page, whose filters and pages cover all.
 */
export const shotChoicesQueryOptions = (teamId: string) => shotsQueryOptions(teamId, { pageSize: SHOTS_PAGE_MAX });

export const useShotChoices = (teamId: string) => useQuery(shotChoicesQueryOptions(teamId));
