import { SiteSectionScreen } from "./site-section-screen";

export function SitePlanScreen() {
  return (
    <SiteSectionScreen
      title="Plan"
      icon="plan"
      emptyTitle="No plan yet"
      emptyBody="For every device: PoE and its class, a splitter, the existing outlet or a new one, with the reasons. Switch budgets and time on battery sit beside the list."
    />
  );
}
