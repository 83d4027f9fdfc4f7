import { SiteSectionScreen } from "./site-section-screen";

export function SiteReportScreen() {
  return (
    <SiteSectionScreen
      title="Report"
      icon="report"
      emptyTitle="Not published yet"
      emptyBody="Once the designer publishes the plan, the client reads the scope here, asks for changes or signs it off."
    />
  );
}
