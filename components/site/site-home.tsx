import { Redirect, useLocalSearchParams } from "expo-router";
import { useMe } from "@/hooks/queries/me";
import { SiteRoomsScreen } from "./site-rooms-screen";

/** A site opens on its walk for the team, and on its scope for the homeowner. */
export function SiteHome() {
  const me = useMe();
  const { id } = useLocalSearchParams<{ id: string }>();
  if (me.role === "client") return <Redirect href={`/sites/${id}/report`} />;
  return <SiteRoomsScreen />;
}
