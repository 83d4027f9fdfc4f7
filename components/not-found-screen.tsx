import { Link } from "expo-router";
import { StyleSheet, View } from "react-native";
import { LogoMark } from "@/components/ui/logo";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";

export function NotFoundScreen() {
  return (
    <View style={styles.root}>
      <LogoMark size={56} />
      <AppText variant="heading">This page is not on the plan</AppText>
      <AppText muted style={{ textAlign: "center" }}>The link may be old, or the site was removed.</AppText>
      <Link href="/" style={styles.link}>
        Back to your sites
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1, alignItems: "center", justifyContent: "center", gap: space.md, padding: space.xl, backgroundColor: colors.paper },
  link: { color: colors.copper700, fontSize: 16, fontWeight: "700", padding: space.md, textDecorationLine: "underline" },
});
