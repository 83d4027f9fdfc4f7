// The desk's plan writes: shown at once, replaced by the server's plan, rolled back when refused.
import { QueryClient } from "@tanstack/react-query";
import { describe, expect, it } from "vitest";
import { planKeys, planWriteHandlers, type Plan } from "@/hooks/queries/plan";
import { priceMaterials } from "@/survey/materials";

const plan = (total: number) => ({ prices: {}, materials: { lines: [], total, pricedCount: 0, unpricedCount: 0 } }) as unknown as Plan;

describe("planWriteHandlers", () => {
  it("applies the optimistic change, then rolls back to the plan before it on an error", async () => {
    const qc = new QueryClient();
    qc.setQueryData(planKeys.detail("s1"), plan(10));
    const h = planWriteHandlers<number>(qc, "s1", (p, total) => ({ ...p, materials: { ...p.materials, total } }));
    const context = await h.onMutate(99);
    expect(qc.getQueryData<Plan>(planKeys.detail("s1"))!.materials.total).toBe(99);
    h.onError(new Error("refused"), 99, context);
    expect(qc.getQueryData<Plan>(planKeys.detail("s1"))!.materials.total).toBe(10);
  });

  it("puts the server's plan in on success", async () => {
    const qc = new QueryClient();
    qc.setQueryData(planKeys.detail("s1"), plan(10));
    const h = planWriteHandlers<number>(qc, "s1", (p) => p);
    await h.onMutate(1);
    h.onSuccess({ plan: plan(42) });
    expect(qc.getQueryData<Plan>(planKeys.detail("s1"))!.materials.total).toBe(42);
  });

  it("re-prices the materials on this side with the same code as the server", () => {
    const lines = [{ key: "a", group: "cable", item: "Cable", detail: "", quantity: 12, unit: "m", deviceIds: [], note: "" }] as const;
    expect(priceMaterials(lines as never, { a: 0.35 }).total).toBe(4.2);
  });
});
