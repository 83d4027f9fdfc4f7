import type { ReactNode } from "react";
import { ScrollView, StyleSheet, View } from "react-native";
import { CONTENT_MAX_WIDTH, colors, space } from "@/constants/theme";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { AppText } from "./text";

/** A scrolling page with a title; content is capped in width on wide screens. */
export function Screen({ title, subtitle, actions, children }: { title: string; subtitle?: string; actions?: ReactNode; children: ReactNode }) {
  const { wide } = useBreakpoint();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={[styles.content, wide && styles.contentWide]}>
      <View style={styles.inner}>
        <View style={[styles.header, wide && styles.headerWide]}>
          <View style={styles.titles}>
            <AppText variant="title">{title}</AppText>
            {subtitle ? <AppText muted>{subtitle}</AppText> : null}
          </View>
          {actions ? <View style={styles.actions}>{actions}</View> : null}
        </View>
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.lg, paddingBottom: space.xxl * 2 },
  contentWide: { padding: space.xxl },
  inner: { width: "100%", maxWidth: CONTENT_MAX_WIDTH, alignSelf: "center", gap: space.lg },
  header: { gap: space.md },
  headerWide: { flexDirection: "row", alignItems: "flex-end", justifyContent: "space-between" },
  titles: { gap: space.xs, flexShrink: 1 },
  actions: { flexDirection: "row", gap: space.sm, flexWrap: "wrap" },
});
