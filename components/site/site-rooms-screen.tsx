import { SiteSectionScreen } from "./site-section-screen";

export function SiteRoomsScreen() {
  return (
    <SiteSectionScreen
      title="Rooms"
      icon="rooms"
      emptyTitle="No rooms captured yet"
      emptyBody="Floors, rooms and every device the surveyor captures on the walk appear here, each with its mount point, power need and cable run, and the gaps still open."
    />
  );
}
