import { Redirect, useLocalSearchParams } from "expo-router";
import type { ReactNode } from "react";
import { useMe } from "@/hooks/queries/me";

/**
 * The walk's rooms and devices are the team's working copy, kept on the phone: a homeowner who opens
 * one of their addresses (a shared link, a typed URL) is taken to the site's scope instead.
 */
export function TeamOnly({ children }: { children: ReactNode }) {
  const me = useMe();
  const { id } = useLocalSearchParams<{ id?: string }>();
  if (me.role === "client") return <Redirect href={id ? `/sites/${id}/report` : "/"} />;
  return children;
}
