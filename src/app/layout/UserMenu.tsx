import { useNavigate } from "react-router-dom";
import { Menu, MenuItem, MenuLabel, MenuSeparator } from "@/components/ui";
import { useSession, useUpdatePrefs } from "@/lib/session";
import { useSignOut } from "@/features/auth/api/signOut";
import type { UnitSystem } from "@shared/units";

const initials = (name: string) =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((p) => p[0]!.toUpperCase())
    .join("") || "?";

const unitChoices: { value: UnitSystem; label: string; example: string }[] = [
  { value: "metric", label: "Metric", example: "km/h · mm · N · J" },
  { value: "imperial", label: "Imperial", example: "mph · in · lbf · ft·lbf" },
];

export function UserMenu() {
  const me = useSession();
  const prefs = useUpdatePrefs();
  const signOut = useSignOut();
  const navigate = useNavigate();

  return (
    <Menu
      align="end"
      triggerClassName="flex h-10 items-center gap-2 rounded-full py-1 pr-2 pl-1 hover:bg-sunken"
      trigger={
        <>
          <span className="sr-only">Account: </span>
          <span aria-hidden className="flex size-8 items-center justify-center rounded-full bg-ink text-xs font-semibold text-white">
            {initials(me.user.name)}
          </span>
          {/* Hidden on phones but still the button's name. */}
          <span className="sr-only max-w-40 truncate text-sm font-medium text-ink lg:not-sr-only">{me.user.name}</span>
        </>
      }
    >
      <div className="px-3 pt-2 pb-2">
        <p className="truncate text-sm font-semibold">{me.user.name}</p>
        <p className="truncate text-sm text-ink-muted">{me.user.email}</p>
      </div>
      <MenuSeparator />
      <MenuLabel>Units</MenuLabel>
      {unitChoices.map((u) => (
        <MenuItem key={u.value} checked={me.prefs.units === u.value} keepOpen onSelect={() => me.prefs.units !== u.value && prefs.mutate({ units: u.value })}>
          <span className="flex items-baseline justify-between gap-3">
            <span className="font-medium">{u.label}</span>
            <span className="text-xs text-ink-muted">{u.example}</span>
          </span>
        </MenuItem>
      ))}
      <MenuSeparator />
      <MenuItem onSelect={() => signOut.mutate(undefined, { onSettled: () => navigate("/sign-in", { replace: true }) })}>Sign out</MenuItem>
    </Menu>
  );
}
