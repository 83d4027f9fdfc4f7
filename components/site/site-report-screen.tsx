import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { colors } from "@/constants/theme";
import { SiteSectionScreen } from "./site-section-screen";

export function SiteReportScreen() {
  return (
    <SiteSectionScreen>
      {() => (
        <EmptyState
          icon={<Icon name="report" size={40} color={colors.slate600} />}
          title="Not published yet"
          body="Once the designer publishes the plan, the client reads the scope here, asks for changes or signs it off."
        />
      )}
    </SiteSectionScreen>
  );
}
