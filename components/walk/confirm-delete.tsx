import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { Button } from "@/components/ui/button";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";

/** A delete button that asks once more, in place, before anything is removed. */
export function ConfirmDelete({ label, question, onConfirm }: { label: string; question: string; onConfirm: () => Promise<void> }) {
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  if (!asking) return <Button tone="secondary" label={label} onPress={() => setAsking(true)} style={{ alignSelf: "flex-start" }} />;
  return (
    <View role="alertdialog" aria-label={question} style={styles.box}>
      <AppText style={{ color: colors.danger, fontWeight: "700" }}>{question}</AppText>
      <View style={styles.row}>
        <Button
          tone="danger"
          label={`Yes, ${label.toLowerCase()}`}
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
        <Button tone="quiet" label="Keep it" onPress={() => setAsking(false)} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, padding: space.md, borderRadius: radius.md, backgroundColor: colors.dangerBg, borderWidth: 1, borderColor: colors.danger },
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
});
