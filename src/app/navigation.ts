/**
 * Navigation for signed-in people, by role (the public links live in the app shell). Add a
 * feature's page here with the roles that may open it; the server still checks every request.
 */
import type { Role, SessionUser } from "@shared/schemas/auth";
import type { NavItem } from "@/components/layout/app-shell";
import { paths } from "@/config/paths";

type RoleNavItem = NavItem & {
  /** Who sees the link: everyone signed in, or holders of any of these roles. */
  for: "signedIn" | Role[];
};

const roleNavigation: RoleNavItem[] = [
  { to: paths.logDropOff(), label: "Log a drop-off", for: ["resident"] },
  { to: paths.dropOffs(), label: "Your drop-offs", end: true, for: ["resident"] },
  { to: paths.household(), label: "Household", for: ["resident"] },
  { to: paths.stewardToday(), label: "Digesters today", for: ["steward", "coordinator"] },
  { to: paths.coordinator(), label: "Assignments", for: ["coordinator"] },
  { to: paths.collectionRounds(), label: "Collection rounds", for: ["coordinator", "resident"] },
  { to: paths.people(), label: "People", for: ["coordinator"] },
  { to: paths.account(), label: "Your account", for: "signedIn" },
];

/** The links this person sees after the public ones (none for visitors). */
export function navItemsFor(user: SessionUser | null | undefined): NavItem[] {
  if (!user) return [];
  return roleNavigation
    .filter((item) => item.for === "signedIn" || item.for.some((role) => user.roles.includes(role)))
    .map(({ to, label, end }) => ({ to, label, end }));
}
