import type { IconName } from "@/components/ui/icons";

export interface NavItem {
  href: string;
  label: string;
  icon: IconName;
  /** Path prefixes that count as "inside" this section. */
  match: string[];
}

export const baseNavItems: NavItem[] = [
  { href: "/", label: "Sites", icon: "sites", match: ["/", "/sites"] },
  { href: "/sync", label: "Sync", icon: "sync", match: ["/sync"] },
  { href: "/account", label: "Account", icon: "account", match: ["/account"] },
];

export function isActive(item: NavItem, pathname: string) {
  return item.match.some((m) => (m === "/" ? pathname === "/" : pathname === m || pathname.startsWith(`${m}/`)));
}
