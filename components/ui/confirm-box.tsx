import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";

/**
 * Asks once more, in place, before something is removed: the question, what follows from it, and
 * two answers. The box stays until the removal has gone through or the person keeps the thing.
 */
export function ConfirmBox({ question, detail, confirmLabel, onConfirm, onCancel }: {
  question: string;
  detail?: string;
  confirmLabel: string;
  onConfirm: () => Promise<unknown> | void;
  onCancel: () => void;
}) {
  const [busy, setBusy] = useState(false);
  return (
    <View role="alertdialog" aria-label={question} style={styles.box}>
      <AppText style={{ color: colors.danger, fontWeight: "700" }}>{question}</AppText>
      {detail ? <AppText>{detail}</AppText> : null}
      <View style={styles.row}>
        <Button
          tone="danger"
          label={confirmLabel}
          busy={busy}
          onPress={async () => {
            setBusy(true);
            try {
              await onConfirm();
            } finally {
              setBusy(false);
            }
          }}
        />
        <Button tone="quiet" label="Keep it" onPress={onCancel} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, padding: space.md, borderRadius: radius.md, backgroundColor: colors.dangerBg, borderWidth: 1, borderColor: colors.danger },
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
});
