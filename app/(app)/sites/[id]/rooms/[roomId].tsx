import { TeamOnly } from "@/components/site/team-only";
import { RoomScreen } from "@/components/walk/room-screen";

export default function RoomRoute() {
  return (
    <TeamOnly>
      <RoomScreen />
    </TeamOnly>
  );
}
