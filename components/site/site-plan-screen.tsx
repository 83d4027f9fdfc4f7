import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { colors } from "@/constants/theme";
import { SiteSectionScreen } from "./site-section-screen";

export function SitePlanScreen() {
  return (
    <SiteSectionScreen>
      {() => (
        <EmptyState
          icon={<Icon name="plan" size={40} color={colors.slate600} />}
          title="No plan yet"
          body="For every device: PoE and its class, a splitter, the existing outlet or a new one, with the reasons. Switch budgets and time on battery sit beside the list."
        />
      )}
    </SiteSectionScreen>
  );
}
