// The designer's decisions for a plan's devices, and the automatic port assignment.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { DecisionInput, PowerMethod } from "@/survey/decisions";
import { POWER_METHOD_WORDS } from "@/survey/decisions";
import { apiFetch } from "@/sync/http";
import { planWriteHandlers, type Plan } from "./plan";

export const decisionKeys = {
  root: ["decision"] as const,
  save: (siteId: string) => [...decisionKeys.root, "save", siteId] as const,
  clear: (siteId: string) => [...decisionKeys.root, "clear", siteId] as const,
  assign: (siteId: string) => [...decisionKeys.root, "assign", siteId] as const,
};

export type DecisionVars = { deviceId: string } & Omit<DecisionInput, "force"> & { force?: boolean };

export function useSaveDecision(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: decisionKeys.save(siteId),
    mutationFn: ({ deviceId, ...body }: DecisionVars) => apiFetch<{ plan: Plan }>(`/api/sites/${siteId}/devices/${encodeURIComponent(deviceId)}/decision`, { method: "PUT", body }),
    ...planWriteHandlers<DecisionVars>(qc, siteId, (plan, vars) => ({
      ...plan,
      devices: plan.devices.map((d) =>
        d.deviceId !== vars.deviceId
          ? d
          : {
              ...d,
              recommendation: vars.method,
              label: POWER_METHOD_WORDS[vars.method as PowerMethod],
              decision: {
                method: vars.method,
                poeClass: vars.poeClass ?? null,
                sourceId: vars.sourceId ?? null,
                port: vars.port ?? null,
                splitter: vars.splitter ?? null,
                reason: vars.reason,
                forced: Boolean(vars.force),
                decidedBy: null,
                decidedAt: new Date().toISOString(),
              },
            },
      ),
    })),
  });
}

export function useClearDecision(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: decisionKeys.clear(siteId),
    mutationFn: ({ deviceId, reason }: { deviceId: string; reason: string }) => apiFetch<{ plan: Plan }>(`/api/sites/${siteId}/devices/${encodeURIComponent(deviceId)}/decision`, { method: "DELETE", body: { reason } }),
    ...planWriteHandlers<{ deviceId: string; reason: string }>(qc, siteId, (plan, vars) => ({
      ...plan,
      devices: plan.devices.map((d) => (d.deviceId === vars.deviceId ? { ...d, decision: null, recommendation: d.rule.recommendation as typeof d.recommendation, label: d.rule.label } : d)),
    })),
  });
}

export function useAssignPorts(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: decisionKeys.assign(siteId),
    mutationFn: (vars: { reason?: string }) => apiFetch<{ plan: Plan; placed: number; moved: number }>(`/api/sites/${siteId}/assign-ports`, { body: vars }),
    // The placement is the server's to work out: nothing to guess beforehand.
    ...planWriteHandlers<{ reason?: string }>(qc, siteId, (plan) => plan),
  });
}
