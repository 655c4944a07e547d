import type { Role } from "@/lib/roles";

/**
 * The areas in the top navigation, in order. Home shows the same list as cards.
 * To add an area: add its route in routes.tsx and one entry here.
 */
export interface NavItem {
  to: string;
  label: string;
  /** One line for the home page card: what a person gets done there. */
  description: string;
  /** The card's line for a player, where the staff's would offer what players cannot do. */
  playerDescription?: string;
  /** Roles that see the link; omitted means every member. The server enforces access regardless. */
  roles?: readonly Role[];
}

export const navItems: readonly NavItem[] = [
  { to: "/clips", label: "Clips", description: "Upload high-frame-rate shot clips and follow each one from upload to frames ready for digitising.",
    playerDescription: "The clips of your shots the staff have filmed." },
  { to: "/sticks", label: "Stick lab", description: "Log sticks, run three-point bench flex tests and keep each stick's stiffness history.",
    playerDescription: "Your sticks and how their stiffness has held up in the staff's bench tests." },
  { to: "/readout", label: "Shots", description: "Find a shot and open its readout: results with their uncertainty, the phase timeline, charts and the PDF report." },
  { to: "/compare", label: "Side by side", description: "Put two shots next to each other, synced at puck strike, and see which loaded the stick longer and released faster.",
    playerDescription: "Put two of your shots next to each other, synced at puck strike." },
  { to: "/progress", label: "Progress", description: "Follow one player's puck exit speed, blade speed and timing across sessions, with best and typical values.",
    playerDescription: "Follow your puck exit speed, blade speed and timing across sessions, with your best and typical values." },
  { to: "/settings", label: "Settings", description: "Choose your units (metric or imperial) and which e-mails you get." },
  { to: "/roster", label: "Roster", description: "Invite members, set their roles and manage pending invitations.", roles: ["admin"] },
  { to: "/billing", label: "Plan", description: "The club's plan and what it allows, payments, invoices, and the club's teams.", roles: ["admin"] },
  { to: "/audit", label: "Audit log", description: "See who changed roles, sent invitations, deleted clips, shots or sticks, and shared shots.", roles: ["admin"] },
];

export const visibleNav = (role: Role | undefined) => navItems.filter((i) => !i.roles || (role !== undefined && i.roles.includes(role)));
