import { TeamOnly } from "@/components/site/team-only";
import { DeviceScreen } from "@/components/walk/device-screen";

export default function DeviceRoute() {
  return (
    <TeamOnly>
      <DeviceScreen />
    </TeamOnly>
  );
}
