import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { CreateSiteInput, InviteClientInput } from "@/survey/team";
import { apiFetch } from "@/sync/http";

export type SiteStatus = "surveying" | "planning" | "out_for_sign_off" | "signed" | "changes_asked";

export interface SiteSummary {
  id: string;
  name: string;
  address: string;
  status: SiteStatus;
  clientUserId: string | null;
  surveyorIds: string[];
  updatedAt: string;
}

export const siteKeys = {
  root: ["sites"] as const,
  list: () => [...siteKeys.root, "list"] as const,
  detail: (id: string) => [...siteKeys.root, "detail", id] as const,
};

export function useSites() {
  return useQuery({ queryKey: siteKeys.list(), queryFn: () => apiFetch<{ sites: SiteSummary[] }>("/api/sites").then((r) => r.sites) });
}

export function useSite(id: string) {
  return useQuery({ queryKey: siteKeys.detail(id), queryFn: () => apiFetch<{ site: SiteSummary }>(`/api/sites/${id}`).then((r) => r.site) });
}

export function useCreateSite() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSiteInput) => apiFetch<{ site: SiteSummary }>("/api/sites", { body: input }).then((r) => r.site),
    onSuccess: () => qc.invalidateQueries({ queryKey: siteKeys.root }),
  });
}

export function useAssignSurveyors(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (surveyorIds: string[]) => apiFetch<{ site: SiteSummary }>(`/api/sites/${siteId}/surveyors`, { method: "PUT", body: { surveyorIds } }),
    onMutate: async (surveyorIds) => {
      await qc.cancelQueries({ queryKey: siteKeys.detail(siteId) });
      const previous = qc.getQueryData<SiteSummary>(siteKeys.detail(siteId));
      if (previous) qc.setQueryData(siteKeys.detail(siteId), { ...previous, surveyorIds });
      return { previous };
    },
    onError: (_err, _vars, context) => {
      if (context?.previous) qc.setQueryData(siteKeys.detail(siteId), context.previous);
    },
    onSettled: () => qc.invalidateQueries({ queryKey: siteKeys.root }),
  });
}

export function useInviteClient(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteClientInput) => apiFetch(`/api/sites/${siteId}/client`, { body: input }),
    onSettled: () => qc.invalidateQueries({ queryKey: siteKeys.root }),
  });
}
