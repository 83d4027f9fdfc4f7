import { WalkPanel } from "@/components/walk/walk-panel";
import { useMe } from "@/hooks/queries/me";
import { SitePeoplePanel } from "./site-people-panel";
import { SiteSectionScreen } from "./site-section-screen";

/** The "Rooms" tab (the team's): the walk, read from the phone's own store so it works in a basement. */
export function SiteRoomsScreen() {
  const me = useMe();
  const manages = me.role === "admin" || me.role === "designer";
  return (
    <SiteSectionScreen>
      {(site) => <WalkPanel siteId={site.id} after={manages && site.summary ? <SitePeoplePanel site={site.summary} /> : null} />}
    </SiteSectionScreen>
  );
}
