import { PlanView } from "@/components/desk/plan-view";
import { SiteSectionScreen } from "./site-section-screen";

export function SitePlanScreen() {
  return <SiteSectionScreen>{(site) => <PlanView siteId={site.id} />}</SiteSectionScreen>;
}
