// The one answer to "may this user do this to this thing?", used by every API route and by the app
// to hide what a role cannot do. Pure: no database, no HTTP.
//
// Decisions: "allow"; "forbidden" (the user may see the thing but not do this: 403); "hidden" (the
// user may not even know it exists: 404, so another team's ids cannot be probed).

export const ROLES = ["admin", "designer", "surveyor", "client"] as const;
export type Role = (typeof ROLES)[number];
export const TEAM_ROLES = ["admin", "designer", "surveyor"] as const satisfies readonly Role[];
export type TeamRole = (typeof TEAM_ROLES)[number];

export interface Actor {
  userId: string;
  teamId: string;
  role: Role;
}

/** What the policy needs to know about a site. */
export interface SiteAccess {
  teamId: string;
  clientUserId: string | null;
  surveyorIds: readonly string[];
}

export type SiteAction =
  | "site:read" // open it and everything captured in it
  | "site:plan" // read the working plan (decisions, prices, history): the team; the client reads the published scope
  | "site:capture" // add or change floors, rooms, devices, photos
  | "site:manage" // rename, assign surveyors, invite the client, plan and publish
  | "site:sign"; // sign off the published scope, ask for changes

export type TeamAction =
  | "site:list"
  | "site:create"
  | "team:read-members"
  | "team:manage" // invite, change roles, remove members
  | "mail:read-outbox"
  | "rules:evaluate"
  | "desk:read"; // the desk's table of every site of the team

export type Decision = "allow" | "forbidden" | "hidden";

const TEAM_ACTIONS: Record<TeamAction, readonly Role[]> = {
  "site:list": ROLES,
  "site:create": ["admin", "designer"],
  "team:read-members": ["admin", "designer"],
  "team:manage": ["admin"],
  "mail:read-outbox": ["admin"],
  "rules:evaluate": ROLES,
  "desk:read": ["admin", "designer"],
};

export function decideTeam(actor: Actor, action: TeamAction): Decision {
  return TEAM_ACTIONS[action].includes(actor.role) ? "allow" : "forbidden";
}

export function canSeeSite(actor: Actor, site: SiteAccess): boolean {
  if (actor.teamId !== site.teamId) return false;
  switch (actor.role) {
    case "admin":
    case "designer":
      return true;
    case "surveyor":
      return site.surveyorIds.includes(actor.userId);
    case "client":
      return site.clientUserId === actor.userId;
  }
}

export function decideSite(actor: Actor, action: SiteAction, site: SiteAccess): Decision {
  if (!canSeeSite(actor, site)) return "hidden";
  const { role } = actor;
  switch (action) {
    case "site:read":
      return "allow";
    case "site:plan":
      return role === "client" ? "forbidden" : "allow";
    case "site:capture":
      return role === "client" ? "forbidden" : "allow";
    case "site:manage":
      return role === "admin" || role === "designer" ? "allow" : "forbidden";
    case "site:sign":
      return role === "client" ? "allow" : "forbidden";
  }
}

export function can(actor: Actor, action: TeamAction): boolean;
export function can(actor: Actor, action: SiteAction, site: SiteAccess): boolean;
export function can(actor: Actor, action: TeamAction | SiteAction, site?: SiteAccess): boolean {
  if (site) return decideSite(actor, action as SiteAction, site) === "allow";
  return decideTeam(actor, action as TeamAction) === "allow";
}

/** The team actions a role may take, for the app to show or hide controls without a round trip. */
export function teamPermissions(role: Role): Record<TeamAction, boolean> {
  const out = {} as Record<TeamAction, boolean>;
  for (const action of Object.keys(TEAM_ACTIONS) as TeamAction[]) out[action] = TEAM_ACTIONS[action].includes(role);
  return out;
}
