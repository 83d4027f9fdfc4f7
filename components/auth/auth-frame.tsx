import type { ReactNode } from "react";
import { ScrollView, StyleSheet, View } from "react-native";
import { Wordmark } from "@/components/ui/logo";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";
import { useBreakpoint } from "@/hooks/use-breakpoint";

/** The frame around sign-in and invitations: brand band on top (phone) or beside (wide). */
export function AuthFrame({ title, subtitle, children }: { title: string; subtitle?: string; children: ReactNode }) {
  const { wide } = useBreakpoint();
  return (
    <ScrollView style={{ flex: 1, backgroundColor: colors.paper }} contentContainerStyle={[styles.root, wide && styles.rootWide]}>
      <View style={[styles.brand, wide && styles.brandWide]}>
        <Wordmark onDark />
        <AppText style={styles.tagline}>Walk the house. Plan every drop. Get it signed.</AppText>
      </View>
      <View style={[styles.panel, wide && styles.panelWide]} role="main">
        <AppText variant="title">{title}</AppText>
        {subtitle ? <AppText muted>{subtitle}</AppText> : null}
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  root: { flexGrow: 1 },
  rootWide: { flexDirection: "row", alignItems: "stretch" },
  brand: { backgroundColor: colors.slate800, padding: space.xl, paddingTop: space.xxl, gap: space.md },
  brandWide: { width: 420, justifyContent: "center", padding: space.xxl * 1.5 },
  tagline: { color: colors.onDarkMuted, fontSize: 17 },
  panel: { padding: space.xl, gap: space.lg, width: "100%", maxWidth: 520, alignSelf: "center", borderRadius: radius.lg },
  panelWide: { justifyContent: "center", marginVertical: space.xxl },
});
