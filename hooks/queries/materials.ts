// A plan's materials: unit prices per site (re-priced at once, on this side, while the server saves)
// and the CSV export.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { priceMaterials } from "@/survey/materials";
import { apiFetch } from "@/sync/http";
import { planWriteHandlers, type Plan } from "./plan";

export const materialsKeys = {
  root: ["materials"] as const,
  prices: (siteId: string) => [...materialsKeys.root, "prices", siteId] as const,
};

export const materialsCsvUrl = (siteId: string) => `/api/sites/${siteId}/materials.csv`;

export function useSetPrices(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: materialsKeys.prices(siteId),
    mutationFn: (prices: Record<string, number | null>) => apiFetch<{ plan: Plan }>(`/api/sites/${siteId}/prices`, { method: "PUT", body: prices }),
    ...planWriteHandlers<Record<string, number | null>>(qc, siteId, (plan, changes) => {
      const prices = { ...plan.prices };
      for (const [k, p] of Object.entries(changes)) {
        if (p === null) delete prices[k];
        else prices[k] = p;
      }
      return { ...plan, prices, materials: priceMaterials(plan.materials.lines, prices) };
    }),
  });
}
