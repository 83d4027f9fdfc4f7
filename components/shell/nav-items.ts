import type { IconName } from "@/components/ui/icons";
import type { Role } from "@/survey/policy";

export interface NavItem {
  href: string;
  label: string;
  icon: IconName;
  /** Path prefixes that count as "inside" this section. */
  match: string[];
}

const sites = (label: string, icon: IconName = "sites"): NavItem => ({ href: "/", label, icon, match: ["/", "/sites"] });
const sync: NavItem = { href: "/sync", label: "Sync", icon: "sync", match: ["/sync"] };
const team: NavItem = { href: "/team", label: "Team", icon: "team", match: ["/team"] };
const account: NavItem = { href: "/account", label: "Account", icon: "account", match: ["/account"] };

/** Each role's navigation: what it cannot use is not shown at all. */
export function navItemsFor(role: Role): NavItem[] {
  switch (role) {
    case "admin":
      return [sites("Sites"), team, account];
    case "designer":
      return [sites("Desk", "desk"), account];
    case "surveyor":
      return [sites("Walks"), sync, account];
    case "client":
      return [sites("Scope", "report"), account];
  }
}

export function isActive(item: NavItem, pathname: string) {
  return item.match.some((m) => (m === "/" ? pathname === "/" : pathname === m || pathname.startsWith(`${m}/`)));
}
