import { useState } from "react";
import { Pressable, StyleSheet, View, type ViewStyle } from "react-native";
import { AppText } from "@/components/ui/text";
import { colors, fonts, minTouch, space } from "@/constants/theme";
import { reasonsBesideDecision, type ReportDevice } from "@/survey/report";

/**
 * A scope device's words: in everyday language first, with the rules' technical reasons behind
 * "Technical detail". A version published before the everyday words were kept shows its reasons.
 */
export function DeviceWords({ device }: { device: ReportDevice }) {
  const [open, setOpen] = useState(false);
  const reasons = reasonsBesideDecision(device);
  if (device.plain === undefined) {
    return reasons.map((r, i) => <AppText key={i} muted>{`• ${r}`}</AppText>);
  }
  return (
    <View style={styles.words}>
      {device.plain.map((w, i) => <AppText key={i}>{w}</AppText>)}
      {reasons.length ? (
        <>
          <Pressable
            role="button"
            aria-expanded={open}
            aria-label={`Technical detail for ${device.name}`}
            onPress={() => setOpen(!open)}
            style={({ focused }: { pressed: boolean; focused?: boolean }) => [styles.toggle, focused && styles.focused]}
          >
            <AppText style={styles.toggleText}>{open ? "Hide the technical detail" : "Technical detail, for your installer"}</AppText>
          </Pressable>
          {open ? reasons.map((r, i) => <AppText key={`r${i}`} muted variant="caption">{`• ${r}`}</AppText>) : null}
        </>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  words: { gap: space.xs },
  toggle: { minHeight: minTouch, justifyContent: "center", alignSelf: "flex-start" },
  focused: { outlineColor: colors.copper500, outlineWidth: 3, outlineStyle: "solid" } as ViewStyle,
  toggleText: { color: colors.copper700, fontFamily: fonts.semibold, textDecorationLine: "underline" },
});
