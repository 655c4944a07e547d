import type { RouteObject } from "react-router-dom";
import { NotFound } from "./NotFound";

/**
 * Pages inside the signed-in layout (top bar, team switcher, nav). Each real page is a lazy route
 * module under src/features/<area>/routes/ that exports `Component` (and, if it wants, `loader`,
 * `ErrorBoundary`, `handle`). To add an area: put its route here and its link in nav.ts.
 */
export const signedInRoutes: RouteObject[] = [
  { index: true, handle: { title: "Home" }, lazy: () => import("@/features/home/routes/HomePage") },
  { path: "clips", handle: { title: "Clips" }, lazy: () => import("@/features/clips/routes/ClipsPage") },
  { path: "clips/:clipId", handle: { title: "Clip" }, lazy: () => import("@/features/clips/routes/ClipPage") },
  // Shots of a clip and the Digitise page (src/features/digitise).
  { path: "clips/:clipId/shots", handle: { title: "Shots" }, lazy: () => import("@/features/digitise/routes/ClipShotsPage") },
  { path: "clips/:clipId/shots/:shotId/digitise", handle: { title: "Digitise" }, lazy: () => import("@/features/digitise/routes/DigitisePage") },
  {
    path: "sticks",
    handle: { title: "Stick lab" },
    children: [
      { index: true, lazy: () => import("@/features/sticklab/routes/SticksPage") },
      { path: ":stickId", handle: { title: "Stick" }, lazy: () => import("@/features/sticklab/routes/StickPage") },
      { path: ":stickId/bench-tests/new", handle: { title: "New bench test" }, lazy: () => import("@/features/sticklab/routes/NewBenchTestPage") },
      { path: ":stickId/bench-tests/:testId", handle: { title: "Bench test" }, lazy: () => import("@/features/sticklab/routes/BenchTestPage") },
      { path: ":stickId/beam", handle: { title: "Beam model" }, lazy: () => import("@/features/sticklab/routes/BeamPage") },
    ],
  },
  // Shot readout, side by side, progress and one's own settings (src/features/readout, compare, progress, settings).
  { path: "readout", handle: { title: "Shots" }, lazy: () => import("@/features/readout/routes/ShotsPage") },
  { path: "readout/:shotId", handle: { title: "Shot readout" }, lazy: () => import("@/features/readout/routes/ReadoutPage") },
  { path: "compare", handle: { title: "Side by side" }, lazy: () => import("@/features/compare/routes/ComparePage") },
  { path: "progress", handle: { title: "Progress" }, lazy: () => import("@/features/progress/routes/ProgressPage") },
  { path: "settings", handle: { title: "Settings" }, lazy: () => import("@/features/settings/routes/SettingsPage") },
  { path: "roster", handle: { title: "Roster" }, lazy: () => import("@/features/roster/routes/RosterPage") },
  { path: "audit", handle: { title: "Audit log" }, lazy: () => import("@/features/audit/routes/AuditPage") },
  { path: "billing", handle: { title: "Plan and billing" }, lazy: () => import("@/features/billing/routes/BillingPage") },
  { path: "*", handle: { title: "Not found" }, element: <NotFound /> },
];

/** Pages anyone can open, signed in or not. */
export const publicRoutes: RouteObject[] = [
  { path: "forgot-password", handle: { title: "Forgot password" }, lazy: () => import("@/features/auth/routes/ForgotPasswordPage") },
  { path: "reset-password", handle: { title: "Choose a new password" }, lazy: () => import("@/features/auth/routes/ResetPasswordPage") },
  { path: "invite/:id", handle: { title: "Invitation" }, lazy: () => import("@/features/auth/routes/AcceptInvitePage") },
  { path: "sign-up", handle: { title: "Start a club" }, lazy: () => import("@/features/auth/routes/SignUpPage") },
  { path: "sign-up/:token", handle: { title: "Your club" }, lazy: () => import("@/features/auth/routes/SignUpDetailsPage") },
];
