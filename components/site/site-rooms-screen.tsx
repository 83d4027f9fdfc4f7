import { EmptyState } from "@/components/ui/empty-state";
import { Icon } from "@/components/ui/icons";
import { colors } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { SitePeoplePanel } from "./site-people-panel";
import { SiteSectionScreen } from "./site-section-screen";

export function SiteRoomsScreen() {
  const me = useMe();
  const manages = me.role === "admin" || me.role === "designer";
  return (
    <SiteSectionScreen>
      {(site) => (
        <>
          <EmptyState
            icon={<Icon name="rooms" size={40} color={colors.slate600} />}
            title="No rooms captured yet"
            body="Floors, rooms and every device the surveyor captures on the walk appear here, each with its mount point, power need and cable run, and the gaps still open."
          />
          {manages ? <SitePeoplePanel site={site} /> : null}
        </>
      )}
    </SiteSectionScreen>
  );
}
