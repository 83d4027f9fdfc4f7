import type { ReactNode } from "react";
import { Link, usePathname } from "expo-router";
import { Pressable, StyleSheet, View } from "react-native";
import { useSafeAreaInsets } from "react-native-safe-area-context";
import { Icon } from "@/components/ui/icons";
import { Wordmark } from "@/components/ui/logo";
import { AppText } from "@/components/ui/text";
import { SIDE_NAV_WIDTH, colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useBreakpoint } from "@/hooks/use-breakpoint";
import { isActive, type NavItem } from "./nav-items";

/** Phone: content above a bottom bar. Wide: a side rail beside the content. */
export function AppShell({ items, footer, children }: { items: NavItem[]; footer?: ReactNode; children: ReactNode }) {
  const { wide } = useBreakpoint();
  const pathname = usePathname();
  const insets = useSafeAreaInsets();

  if (wide) {
    return (
      <View style={styles.wideRoot}>
        <View style={styles.rail} role="navigation" aria-label="Main">
          <View style={styles.railBrand}>
            <Wordmark onDark />
          </View>
          <View style={styles.railItems}>
            {items.map((item) => {
              const active = isActive(item, pathname);
              return (
                <Link key={item.href} href={item.href as never} asChild>
                  <Pressable role="link" aria-current={active ? "page" : undefined} style={StyleSheet.flatten([styles.railItem, active && styles.railItemActive])}>
                    <Icon name={item.icon} color={active ? colors.copper500 : colors.onDarkMuted} />
                    <AppText style={[styles.railLabel, active && styles.railLabelActive]}>{item.label}</AppText>
                  </Pressable>
                </Link>
              );
            })}
          </View>
          {footer ? <View style={styles.railFooter}>{footer}</View> : null}
        </View>
        <View style={styles.main} role="main">
          {children}
        </View>
      </View>
    );
  }

  return (
    <View style={styles.phoneRoot}>
      <View style={[styles.topBar, { paddingTop: insets.top + space.sm }]}>
        <Wordmark onDark />
        {footer}
      </View>
      <View style={styles.main} role="main">
        {children}
      </View>
      <View style={[styles.bottomBar, { paddingBottom: insets.bottom }]} role="navigation" aria-label="Main">
        {items.map((item) => {
          const active = isActive(item, pathname);
          return (
            <Link key={item.href} href={item.href as never} asChild>
              <Pressable role="link" aria-current={active ? "page" : undefined} style={styles.tab}>
                <View style={[styles.tabPill, active && styles.tabPillActive]}>
                  <Icon name={item.icon} size={22} color={active ? colors.slate800 : colors.inkMuted} />
                </View>
                <AppText style={[styles.tabLabel, active && styles.tabLabelActive]}>{item.label}</AppText>
              </Pressable>
            </Link>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wideRoot: { flex: 1, flexDirection: "row", backgroundColor: colors.paper },
  rail: { width: SIDE_NAV_WIDTH, backgroundColor: colors.slate800, paddingVertical: space.xl, paddingHorizontal: space.md },
  railBrand: { paddingHorizontal: space.sm, paddingBottom: space.xl },
  railItems: { gap: space.xs, flex: 1 },
  railItem: {
    flexDirection: "row",
    alignItems: "center",
    gap: space.md,
    minHeight: minTouch,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
  },
  railItemActive: { backgroundColor: colors.slate900 },
  railLabel: { color: colors.onDarkMuted, fontFamily: fonts.semibold },
  railLabelActive: { color: colors.onDark, fontFamily: fonts.bold },
  railFooter: { paddingHorizontal: space.sm, gap: space.sm },
  main: { flex: 1 },
  phoneRoot: { flex: 1, backgroundColor: colors.paper },
  topBar: {
    backgroundColor: colors.slate800,
    paddingHorizontal: space.lg,
    paddingBottom: space.md,
    flexDirection: "row",
    alignItems: "center",
    justifyContent: "space-between",
  },
  bottomBar: {
    flexDirection: "row",
    backgroundColor: colors.card,
    borderTopWidth: 1,
    borderTopColor: colors.line,
    paddingTop: space.xs,
  },
  tab: { flex: 1, alignItems: "center", justifyContent: "center", minHeight: 60, gap: 2 },
  tabPill: { paddingHorizontal: space.lg, paddingVertical: 4, borderRadius: radius.pill },
  tabPillActive: { backgroundColor: colors.copper100 },
  tabLabel: { fontSize: 12, lineHeight: 16, fontFamily: fonts.semibold, color: colors.inkMuted },
  tabLabelActive: { color: colors.slate800, fontFamily: fonts.bold },
});
