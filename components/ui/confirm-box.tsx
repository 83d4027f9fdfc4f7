import { useEffect, useRef, useState, type ReactNode } from "react";
import { StyleSheet, View } from "react-native";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";

/**
 * Asks once more, in place, before something is removed: the question, what follows from it, and
 * two answers. `onClose` closes it: on the safe answer, and once the confirmed action has gone
 * through or failed (`onConfirm` shows its own error). A second press while the first is still
 * going through does nothing (a double click acts once).
 */
export function ConfirmBox({ question, detail, confirmLabel, keepLabel = "Keep it", onConfirm, onClose, children }: {
  question: string;
  detail?: string;
  confirmLabel: string;
  keepLabel?: string;
  onConfirm: () => Promise<unknown> | void;
  onClose: () => void;
  children?: ReactNode;
}) {
  const [busy, setBusy] = useState(false);
  const running = useRef(false);
  // The box opens where the button was: the focus goes to its safe answer, so a keyboard user is
  // in the question at once and Enter keeps things as they are.
  const keep = useRef<View>(null);
  useEffect(() => {
    (keep.current as unknown as { focus?: () => void } | null)?.focus?.();
  }, []);
  return (
    <View role="alertdialog" aria-label={question} style={styles.box}>
      <AppText style={{ color: colors.danger, fontWeight: "700" }}>{question}</AppText>
      {detail ? <AppText>{detail}</AppText> : null}
      {children}
      <View style={styles.row}>
        <Button
          tone="danger"
          label={confirmLabel}
          busy={busy}
          onPress={async () => {
            if (running.current) return;
            running.current = true;
            setBusy(true);
            try {
              await onConfirm();
            } finally {
              running.current = false;
              setBusy(false);
              onClose();
            }
          }}
        />
        <Button ref={keep} tone="quiet" label={keepLabel} onPress={onClose} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, padding: space.md, borderRadius: radius.md, backgroundColor: colors.dangerBg, borderWidth: 1, borderColor: colors.danger },
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
});
