import { Pressable, StyleSheet, View } from "react-native";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { AppText } from "./text";

export interface Choice<T extends string> {
  value: T;
  label: string;
}

/** A single choice among a few options, as a row of large chips (a radio group). */
export function ChoiceChips<T extends string>({ label, value, choices, onChange, errors }: { label: string; value: T | undefined; choices: Choice<T>[]; onChange: (v: T) => void; errors?: string[] }) {
  return (
    <View style={styles.wrap}>
      <AppText variant="label" style={{ color: colors.slate800 }}>
        {label}
      </AppText>
      <View role="radiogroup" aria-label={label} aria-invalid={errors?.length ? true : undefined} style={styles.row}>
        {choices.map((c) => {
          const selected = c.value === value;
          return (
            <Pressable
              key={c.value}
              role="radio"
              aria-checked={selected}
              aria-label={c.label}
              onPress={() => onChange(c.value)}
              style={StyleSheet.flatten([styles.chip, selected && styles.chipOn, errors?.length ? styles.chipInvalid : null])}
            >
              <AppText style={[styles.chipLabel, selected && styles.chipLabelOn]}>{c.label}</AppText>
            </Pressable>
          );
        })}
      </View>
      {errors?.length ? (
        <AppText role="alert" style={{ color: colors.danger, fontFamily: fonts.semibold, fontSize: 14 }}>
          {errors.join(" ")}
        </AppText>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
  chip: {
    minHeight: minTouch - 4,
    paddingHorizontal: space.lg,
    justifyContent: "center",
    borderRadius: radius.pill,
    borderWidth: 1.5,
    borderColor: colors.slate100,
    backgroundColor: colors.card,
  },
  chipOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  chipInvalid: { borderColor: colors.danger },
  chipLabel: { fontFamily: fonts.semibold, color: colors.slate700 },
  chipLabelOn: { color: colors.onDark },
});
