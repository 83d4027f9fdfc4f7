import { Link, usePathname } from "expo-router";
import { Pressable, StyleSheet, View } from "react-native";
import { Icon, type IconName } from "@/components/ui/icons";
import { AppText } from "@/components/ui/text";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";

const SECTIONS: { suffix: string; label: string; icon: IconName }[] = [
  { suffix: "", label: "Rooms", icon: "rooms" },
  { suffix: "/plan", label: "Plan", icon: "plan" },
  { suffix: "/report", label: "Report", icon: "report" },
];

/** The three views of one site: what was captured, what is planned, what the client signs. */
export function SiteTabs({ siteId }: { siteId: string }) {
  const pathname = usePathname();
  const me = useMe();
  // A homeowner reads the published scope; the walk and the plan are the team's.
  const sections = me.role === "client" ? SECTIONS.filter((s) => s.suffix === "/report") : SECTIONS;
  return (
    <View style={styles.row} role="tablist" aria-label="Site sections">
      {sections.map((s) => {
        const href = `/sites/${siteId}${s.suffix}`;
        const active = pathname === href;
        return (
          <Link key={s.label} href={href as never} asChild>
            <Pressable role="tab" aria-selected={active} style={StyleSheet.flatten([styles.tab, active && styles.active])}>
              <Icon name={s.icon} size={20} color={active ? colors.onDark : colors.slate700} />
              <AppText style={[styles.label, active && styles.labelActive]}>{s.label}</AppText>
            </Pressable>
          </Link>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: "row", gap: space.sm, flexWrap: "wrap" },
  tab: {
    flexDirection: "row",
    alignItems: "center",
    gap: space.sm,
    minHeight: minTouch,
    paddingHorizontal: space.lg,
    borderRadius: radius.pill,
    borderWidth: 1.5,
    borderColor: colors.slate100,
    backgroundColor: colors.card,
  },
  active: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  label: { fontFamily: fonts.semibold, color: colors.slate700 },
  labelActive: { color: colors.onDark, fontFamily: fonts.bold },
});
