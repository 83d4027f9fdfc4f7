// The closet of a site: power sources (switches, injectors, outlets) and battery backups.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/sync/http";
import { planWriteHandlers, type Plan } from "./plan";

export type ClosetKind = "sources" | "batteries";

export const closetKeys = {
  root: ["closet"] as const,
  save: (siteId: string, kind: ClosetKind) => [...closetKeys.root, "save", siteId, kind] as const,
  remove: (siteId: string, kind: ClosetKind) => [...closetKeys.root, "remove", siteId, kind] as const,
};

export interface ClosetSave {
  /** Missing for a new item. */
  id?: string;
  fields: Record<string, unknown>;
}

const listOf = (kind: ClosetKind) => (kind === "sources" ? "sources" : "batteries") as "sources" | "batteries";

export function useSaveClosetItem(siteId: string, kind: ClosetKind) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: closetKeys.save(siteId, kind),
    mutationFn: ({ id, fields }: ClosetSave) =>
      apiFetch<{ id: string; plan: Plan }>(id ? `/api/sites/${siteId}/closet/${kind}/${encodeURIComponent(id)}` : `/api/sites/${siteId}/closet/${kind}`, { method: id ? "PATCH" : "POST", body: fields }),
    ...planWriteHandlers<ClosetSave>(qc, siteId, (plan, { id, fields }) => {
      if (!id) return plan;
      const list = plan.closet[listOf(kind)].map((i) => (i.id === id ? { ...i, data: { ...i.data, ...fields } } : i));
      return { ...plan, closet: { ...plan.closet, [listOf(kind)]: list } };
    }),
  });
}

export function useRemoveClosetItem(siteId: string, kind: ClosetKind) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: closetKeys.remove(siteId, kind),
    mutationFn: (id: string) => apiFetch<{ plan: Plan }>(`/api/sites/${siteId}/closet/${kind}/${encodeURIComponent(id)}`, { method: "DELETE" }),
    ...planWriteHandlers<string>(qc, siteId, (plan, id) => ({
      ...plan,
      closet: { ...plan.closet, [listOf(kind)]: plan.closet[listOf(kind)].filter((i) => i.id !== id) },
    })),
  });
}
