import { forwardRef, useId } from "react";
import { StyleSheet, TextInput, View, type TextInputProps } from "react-native";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { AppText } from "./text";

export interface TextFieldProps extends TextInputProps {
  label: string;
  /** Messages from validation (the server's `fields[name]` or the same schema on the phone). */
  errors?: string[];
  hint?: string;
  suffix?: string;
}

export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField({ label, errors, hint, suffix, style, ...rest }, ref) {
  const id = useId();
  const invalid = Boolean(errors?.length);
  return (
    <View style={styles.wrap}>
      <AppText variant="label" nativeID={`${id}-label`} style={styles.label}>
        {label}
      </AppText>
      <View style={[styles.box, invalid && styles.boxInvalid]}>
        <TextInput
          ref={ref}
          aria-label={label}
          aria-invalid={invalid || undefined}
          aria-describedby={invalid ? `${id}-error` : hint ? `${id}-hint` : undefined}
          placeholderTextColor={colors.inkMuted}
          {...rest}
          style={[styles.input, style]}
        />
        {suffix ? <AppText muted style={styles.suffix}>{suffix}</AppText> : null}
      </View>
      {invalid ? (
        <AppText nativeID={`${id}-error`} role="alert" style={styles.error}>
          {errors!.join(" ")}
        </AppText>
      ) : hint ? (
        <AppText nativeID={`${id}-hint`} variant="caption" muted>
          {hint}
        </AppText>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  label: { color: colors.slate800 },
  box: {
    flexDirection: "row",
    alignItems: "center",
    minHeight: minTouch,
    borderWidth: 1.5,
    borderColor: colors.line,
    borderRadius: radius.md,
    backgroundColor: colors.card,
    paddingHorizontal: space.md,
  },
  boxInvalid: { borderColor: colors.danger, backgroundColor: colors.dangerBg },
  input: { flex: 1, fontFamily: fonts.regular, fontSize: 16, color: colors.ink, paddingVertical: space.sm, minHeight: minTouch - 4 },
  suffix: { marginLeft: space.sm },
  error: { color: colors.danger, fontFamily: fonts.semibold, fontSize: 14 },
});
