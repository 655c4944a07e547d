import { env } from "@/lib/env";

/** A frame image of a clip, served by clip ingest. Frames count from 1. */
export const frameUrl = (teamId: string, clipId: string, n: number) =>
  `${env.apiBase}/teams/${encodeURIComponent(teamId)}/clips/${encodeURIComponent(clipId)}/frames/${n}`;

/** The Digitise page of a shot, opened at a frame. */
export const digitiseUrl = (clipId: string, shotId: string, frame?: number) =>
  `/clips/${encodeURIComponent(clipId)}/shots/${encodeURIComponent(shotId)}/digitise${frame ? `?frame=${frame}` : ""}`;
