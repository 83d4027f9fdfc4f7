import { AppProviders } from "@/components/app-providers";
import { Stack } from "expo-router";

export { ErrorBoundary } from "expo-router";

export default function RootLayout() {
  return (
    <AppProviders>
      <Stack screenOptions={{ headerShown: false }} />
    </AppProviders>
  );
}
