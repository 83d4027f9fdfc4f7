import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { ReportChanges, ReportContent } from "@/survey/report";
import { apiFetch } from "@/sync/http";
import { siteKeys } from "./sites";

export interface ReportListItem {
  id: string;
  version: number;
  contentHash: string;
  publishedAt: string;
  signedAt: string | null;
}

export interface ReportComment {
  id: string;
  itemRef: string;
  body: string;
  changeRequest: boolean;
  createdAt: string;
  author: string | null;
  authorId: string | null;
}

export interface ReportView {
  report: { id: string; siteId: string; version: number; contentHash: string; publishedAt: string; latest: boolean };
  content: ReportContent;
  changes: (ReportChanges & { sinceVersion: number }) | null;
  comments: ReportComment[];
  signoff: { typedName: string; signedAt: string; contentHash: string } | null;
  deposit: { status: "unpaid" | "paid"; amountCents: number; currency: string; checkoutUrl: string | null; paidAt: string | null } | null;
}

export const reportKeys = {
  root: ["reports"] as const,
  list: (siteId: string) => [...reportKeys.root, "list", siteId] as const,
  detail: (reportId: string) => [...reportKeys.root, "detail", reportId] as const,
};

export function useSiteReports(siteId: string) {
  return useQuery({ queryKey: reportKeys.list(siteId), queryFn: () => apiFetch<{ reports: ReportListItem[] }>(`/api/sites/${siteId}/reports`).then((r) => r.reports) });
}

export function useReport(reportId: string | undefined) {
  return useQuery({ queryKey: reportKeys.detail(reportId ?? ""), queryFn: () => apiFetch<ReportView>(`/api/reports/${reportId}`), enabled: Boolean(reportId) });
}

function useReportMutation<V, R>(fn: (vars: V) => Promise<R>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: async () => {
      await qc.invalidateQueries({ queryKey: reportKeys.root });
      await qc.invalidateQueries({ queryKey: siteKeys.root });
    },
  });
}

export const usePublishReport = (siteId: string) => useReportMutation(() => apiFetch<{ report: { id: string; version: number } }>(`/api/sites/${siteId}/reports`, { body: {} }));

export const useAddComment = (reportId: string) =>
  useReportMutation((input: { itemRef: string; body: string; changeRequest: boolean }) => apiFetch(`/api/reports/${reportId}/comments`, { body: input }));

export const useSignOff = (reportId: string) =>
  useReportMutation((input: { typedName: string; confirm: boolean; despiteChangeRequests?: boolean }) =>
    apiFetch<{ signoff: { signedAt: string }; deposit: { checkoutUrl: string | null } | null }>(`/api/reports/${reportId}/signoff`, { body: input }),
  );
