import type { ReactNode } from "react";
import { Link } from "expo-router";
import { Pressable, ScrollView, StyleSheet, View } from "react-native";
import { CONTENT_MAX_WIDTH, colors, fonts, minTouch, space } from "@/constants/theme";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { Icon } from "./icons";
import { AppText } from "./text";

/** A scrolling page with a title; content is capped in width on wide screens. */
export function Screen({ title, subtitle, actions, back, children }: { title: string; subtitle?: string; actions?: ReactNode; back?: { href: string; label: string }; children: ReactNode }) {
  const { wide } = useBreakpoint();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={[styles.content, wide && styles.contentWide]}>
      <View style={styles.inner}>
        {back ? (
          <Link href={back.href as never} asChild>
            <Pressable role="link" aria-label={`Back to ${back.label}`} style={styles.back}>
              <Icon name="back" size={20} color={colors.slate700} />
              <AppText style={styles.backLabel} numberOfLines={1}>
                {back.label}
              </AppText>
            </Pressable>
          </Link>
        ) : null}
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
  back: { flexDirection: "row", alignItems: "center", alignSelf: "flex-start", gap: space.xs, minHeight: minTouch - 8, marginBottom: -space.sm, paddingRight: space.md },
  backLabel: { fontFamily: fonts.semibold, color: colors.slate700 },
});
