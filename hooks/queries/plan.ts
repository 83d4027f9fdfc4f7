// A site's plan as the desk reads it: the server's evaluation with the designer's decisions.
// It refreshes every 10 s and whenever this browser's own sync brings surveyors' changes in.
import { useQuery, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import type { PlanView } from "@/server/services/plan";
import { apiFetch } from "@/sync/http";

export type Plan = PlanView;
export type PlanDevice = Plan["devices"][number];
export type PlanSwitch = Plan["switches"][number];
export type PlanHistoryEntry = Plan["history"][string][number];

export const planKeys = {
  root: ["plan"] as const,
  detail: (siteId: string) => [...planKeys.root, siteId] as const,
};

export const PLAN_REFRESH_MS = 10_000;

export function fetchPlan(siteId: string) {
  return apiFetch<{ plan: Plan }>(`/api/sites/${siteId}/plan`).then((r) => r.plan);
}

export function usePlan(siteId: string) {
  const qc = useQueryClient();
  useEffect(() => {
    // The phone-sync keeps its data under the "local" key: when a pull lands, the plan may be stale.
    return qc.getQueryCache().subscribe((event) => {
      if (event.type === "updated" && event.action.type === "success" && event.query.queryKey[0] === "local") {
        // Several local queries settle after one pull: one refetch of the plan is enough.
        const state = qc.getQueryState(planKeys.detail(siteId));
        if (state?.fetchStatus === "fetching" || (state && Date.now() - state.dataUpdatedAt < 2000)) return;
        void qc.invalidateQueries({ queryKey: planKeys.detail(siteId) });
      }
    });
  }, [qc, siteId]);
  return useQuery({ queryKey: planKeys.detail(siteId), queryFn: () => fetchPlan(siteId), refetchInterval: PLAN_REFRESH_MS, refetchIntervalInBackground: false });
}

/**
 * The one shape of a plan write: show the change at once, put the server's plan in when it answers,
 * and go back to what was there when it fails.
 */
export function planWriteHandlers<V>(qc: QueryClient, siteId: string, optimistic: (plan: Plan, vars: V) => Plan) {
  const key = planKeys.detail(siteId);
  return {
    onMutate: async (vars: V) => {
      await qc.cancelQueries({ queryKey: key });
      const previous = qc.getQueryData<Plan>(key);
      if (previous) qc.setQueryData(key, optimistic(previous, vars));
      return { previous };
    },
    onError: (_err: Error, _vars: V, context: { previous?: Plan } | undefined) => {
      if (context?.previous) qc.setQueryData(key, context.previous);
    },
    onSuccess: (data: { plan: Plan }) => {
      qc.setQueryData(key, data.plan);
    },
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  };
}

/** What the walk shows of the desk's plan for one device: the designer's decision, if there is one. */
export interface DeviceDecisionNote {
  /** How the plan powers the device (the decision's label when it applies). */
  label: string;
  /** What the rules advised on their own. */
  ruleLabel: string;
  decision: NonNullable<PlanDevice["decision"]>;
  /** Why the decision no longer applies (it does not fit what was captured since), in the plan's words, or null. */
  stale: string | null;
}

export function deviceDecisionNote(plan: Plan, deviceId: string): DeviceDecisionNote | null {
  const d = plan.devices.find((x) => x.deviceId === deviceId);
  if (!d || !d.decision) return null;
  const stale = d.decisionStale === null ? null : (d.warnings.find((w) => w.code === "decision_stale")?.message ?? d.decisionStale);
  return { label: d.label, ruleLabel: d.rule.label, decision: d.decision, stale };
}

/**
 * The designer's decision on one device, for the surveyor's walk. It reads the plan the phone last
 * fetched (kept for use with no signal), refreshed when the screen opens, not every few seconds.
 */
export function useDeviceDecision(siteId: string, deviceId: string) {
  return useQuery({
    queryKey: planKeys.detail(siteId),
    queryFn: () => fetchPlan(siteId),
    staleTime: 60_000,
    retry: false,
    select: (plan: Plan) => deviceDecisionNote(plan, deviceId),
  });
}
