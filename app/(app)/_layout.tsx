import { Slot } from "expo-router";
import { AppShell } from "@/components/shell/app-shell";
import { baseNavItems } from "@/components/shell/nav-items";

export default function SignedInLayout() {
  return (
    <AppShell items={baseNavItems}>
      <Slot />
    </AppShell>
  );
}
