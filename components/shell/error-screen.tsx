import { router, type ErrorBoundaryProps } from "expo-router";
import { StyleSheet, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";

/**
 * What a screen shows when it fails to draw, in place of the route. It needs none of the app's
 * providers (the root layout's own failure lands here too). What was saved stays saved: the phone's
 * store and its queue of changes are not touched.
 */
export function ErrorScreen({ error, retry }: ErrorBoundaryProps) {
  return (
    <View style={styles.page}>
      <View style={styles.inner}>
        <AppText variant="title">This screen could not be shown</AppText>
        <AppText muted>Everything already saved is kept, on this phone and on the server. Try again, or go back to your sites.</AppText>
        <Banner tone="danger" title="What went wrong">
          {error.message || "An unexpected error."}
        </Banner>
        <View style={styles.actions}>
          <Button label="Try again" onPress={() => void retry()} />
          <Button
            label="Go to your sites"
            tone="secondary"
            onPress={() => {
              try {
                router.replace("/");
              } catch {
                // The navigator itself may be what failed: load the start page afresh instead.
                if (typeof window !== "undefined") window.location.assign("/");
                return;
              }
              void retry();
            }}
          />
        </View>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.paper, padding: space.xl, justifyContent: "center" },
  inner: { width: "100%", maxWidth: 560, alignSelf: "center", gap: space.lg },
  actions: { flexDirection: "row", flexWrap: "wrap", gap: space.md },
});
