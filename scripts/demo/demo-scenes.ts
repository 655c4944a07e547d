// The demo club's digitised shots: which clip holds which made-up scenes. Shared by the seed
// (server/seed/shots.ts), the Digitise end-to-end tests (which know every puck pixel from it) and
// the benchmark. Every number is invented.
import type { SceneOptions } from "./shot-scene";

export interface DemoClip {
  title: string;
  playerEmail: string;
  /** A label from server/seed/sticks.ts DEMO_STICK_LABELS, looked up at seed time. */
  stick: "usedSenior" | "newSenior" | "youth";
  captureFps: number;
  notes: string;
  /** One scene per shot, back to back in the clip. */
  shots: { label: string; scene: SceneOptions; digitised: boolean }[];
}

export const DEMO_SESSION = { date: "2026-11-30", venue: "Lakeport Arena, rink 2", drill: "Stationary slap shots, side camera" };

export const DEMO_CLIPS: DemoClip[] = [
  {
    title: "Slap shots, lane 1 — Theo",
    playerEmail: "player@ravens.example",
    stick: "usedSenior",
    captureFps: 3200,
    notes: "Side camera square to the lane, 4 m back. Puck on the spot mark.",
    shots: [
      { label: "Slap shot 1", digitised: true, scene: { captureFps: 3200, frames: 240, exitSpeedMps: 31.5, bladeSpeedMps: 21, peakDeflectionMm: 44, caption: "Ravens lab cam A", gloves: "#2a8fb0" } },
      { label: "Slap shot 2", digitised: true, scene: { captureFps: 3200, frames: 240, exitSpeedMps: 29.4, bladeSpeedMps: 20, peakDeflectionMm: 40, loadMs: 24, caption: "Ravens lab cam A", gloves: "#2a8fb0" } },
    ],
  },
  {
    title: "Slap shot, lane 1 — Jonah",
    playerEmail: "player2@ravens.example",
    stick: "newSenior",
    captureFps: 2400,
    notes: "Same set-up as Theo's clip.",
    shots: [{ label: "Slap shot 1", digitised: true, scene: { captureFps: 2400, frames: 200, exitSpeedMps: 33, bladeSpeedMps: 22.5, peakDeflectionMm: 47, contactMs: 25, caption: "Ravens lab cam A", gloves: "#b8452f" } }],
  },
  {
    title: "Slap shot, lane 1 — Elin",
    playerEmail: "player3@ravens.example",
    stick: "youth",
    captureFps: 2400,
    notes: "Youth stick; lighter shot.",
    shots: [{ label: "Slap shot 1", digitised: true, scene: { captureFps: 2400, frames: 200, exitSpeedMps: 23, bladeSpeedMps: 16, peakDeflectionMm: 30, loadMs: 26, contactMs: 30, caption: "Ravens lab cam A", gloves: "#6b4fb3" } }],
  },
];
