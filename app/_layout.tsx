import { AppProviders } from "@/components/app-providers";
import { Stack } from "expo-router";

export { ErrorScreen as ErrorBoundary } from "@/components/shell/error-screen";

export default function RootLayout() {
  return (
    <AppProviders>
      <Stack screenOptions={{ headerShown: false }} />
    </AppProviders>
  );
}
