// The desk's table of sites (designers and admins).
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/sync/http";
import type { SiteStatus } from "./sites";

export interface DeskSite {
  id: string;
  name: string;
  address: string;
  status: SiteStatus;
  clientName: string | null;
  surveyors: { id: string; name: string }[];
  /** Counted as the walk counts them: complete, in the plan with gaps, left out of the plan. */
  devices: { total: number; complete: number; withGaps: number; leftOut: number };
  lastSyncAt: string | null;
  updatedAt: string;
}

export const deskKeys = {
  root: ["desk"] as const,
  sites: () => [...deskKeys.root, "sites"] as const,
};

export function useDeskSites() {
  return useQuery({ queryKey: deskKeys.sites(), queryFn: () => apiFetch<{ sites: DeskSite[] }>("/api/desk/sites").then((r) => r.sites), refetchInterval: 30_000 });
}
