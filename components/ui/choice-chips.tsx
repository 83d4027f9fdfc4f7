import { useRef } from "react";
import { Pressable, StyleSheet, View } from "react-native";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { AppText } from "./text";
import { keyOf, webKeyDown, type WebKeyEvent } from "./web-keys";

export interface Choice<T extends string> {
  value: T;
  label: string;
}

/** The keys that move a radio group's choice on the web: arrows step, Space picks the focused one. */
const STEP: Readonly<Record<string, number>> = { ArrowRight: 1, ArrowDown: 1, ArrowLeft: -1, ArrowUp: -1 };

/**
 * A single choice among a few options, as a row of large chips (a radio group). As a radio group
 * should, it is one Tab stop (the chosen chip, or the first): the arrow keys move the choice.
 */
export function ChoiceChips<T extends string>({ label, value, choices, onChange, errors }: { label: string; value: T | undefined; choices: Choice<T>[]; onChange: (v: T) => void; errors?: string[] }) {
  const chips = useRef<({ focus?: () => void } | null)[]>([]);
  const current = choices.findIndex((c) => c.value === value);
  const tabStop = current >= 0 ? current : 0;
  const onKey = (i: number) => (e: WebKeyEvent) => {
    const key = keyOf(e);
    if (key === " ") {
      e.preventDefault?.();
      onChange(choices[i].value);
      return;
    }
    const step = STEP[key];
    if (step === undefined || choices.length === 0) return;
    e.preventDefault?.();
    const next = (i + step + choices.length) % choices.length;
    onChange(choices[next].value);
    chips.current[next]?.focus?.();
  };
  return (
    <View style={styles.wrap}>
      <AppText variant="label" style={{ color: colors.slate800 }}>
        {label}
      </AppText>
      <View role="radiogroup" aria-label={label} aria-invalid={errors?.length ? true : undefined} style={styles.row}>
        {choices.map((c, i) => {
          const selected = c.value === value;
          return (
            <Pressable
              key={c.value}
              ref={(el) => {
                chips.current[i] = el as { focus?: () => void } | null;
              }}
              tabIndex={i === tabStop ? 0 : -1}
              {...webKeyDown(onKey(i))}
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
