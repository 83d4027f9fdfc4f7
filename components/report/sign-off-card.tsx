import { useState } from "react";
import { Linking, Pressable, StyleSheet, View } from "react-native";
import { when } from "@/components/ui/format";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useSignOff, type ReportView } from "@/hooks/queries/reports";
import { ApiError } from "@/sync/http";

const money = (cents: number, currency: string) => `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`;

/** The homeowner's sign-off: their typed full name and an explicit confirmation; then the deposit, if any. */
export function SignOffCard({ view, isClient }: { view: ReportView; isClient: boolean }) {
  const sign = useSignOff(view.report.id);
  const [name, setName] = useState("");
  const [confirmed, setConfirmed] = useState(false);
  const [fields, setFields] = useState<Record<string, string[] | undefined>>({});

  if (view.signoff) {
    return (
      <Card>
        <AppText variant="subheading">Signed</AppText>
        <AppText>{`Signed by ${view.signoff.typedName} on ${when(view.signoff.signedAt)}.`}</AppText>
        <AppText muted variant="caption">{`Version ${view.report.version} · ${view.signoff.contentHash}`}</AppText>
        {view.deposit ? (
          view.deposit.status === "paid" ? (
            <Banner tone="good" title="Deposit paid">{`${money(view.deposit.amountCents, view.deposit.currency)} received.`}</Banner>
          ) : (
            <View style={{ gap: space.sm }}>
              <Banner tone="warn" title="Deposit not paid yet">{`Your installer asks for a deposit of ${money(view.deposit.amountCents, view.deposit.currency)} to start.`}</Banner>
              {isClient && view.deposit.checkoutUrl ? <Button label="Pay the deposit" onPress={() => Linking.openURL(view.deposit!.checkoutUrl!)} /> : null}
            </View>
          )
        ) : null}
      </Card>
    );
  }
  if (!isClient) {
    return (
      <Card>
        <AppText variant="subheading">Waiting for the homeowner</AppText>
        <AppText muted>{view.report.latest ? "This version is out for sign-off." : "A newer version replaced this one."}</AppText>
      </Card>
    );
  }
  if (!view.report.latest) return <Banner tone="warn">A newer version of this scope was published. Read and sign that one.</Banner>;

  async function submit() {
    const next: Record<string, string[]> = {};
    if (name.trim().length < 2) next.typedName = ["Type your full name."];
    if (!confirmed) next.confirm = ["Tick the box to confirm you agree to this scope."];
    setFields(next);
    if (Object.keys(next).length) return;
    try {
      const result = await sign.mutateAsync({ typedName: name.trim(), confirm: true });
      if (result.deposit?.checkoutUrl) await Linking.openURL(result.deposit.checkoutUrl);
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
    }
  }

  return (
    <Card>
      <AppText variant="subheading">Sign off this scope</AppText>
      <AppText muted>{`Signing records your name, the time, this device's address and the fingerprint of version ${view.report.version}. It cannot be changed afterwards; ask for changes first if anything is not right.`}</AppText>
      {sign.error && !Object.keys(fields).length ? <Banner tone="danger">{sign.error.message}</Banner> : null}
      <TextField label="Your full name" value={name} onChangeText={setName} autoComplete="name" errors={fields.typedName} />
      <Pressable role="checkbox" aria-checked={confirmed} aria-label="I have read this scope and agree to it" onPress={() => setConfirmed(!confirmed)} style={styles.check}>
        <View style={[styles.box, confirmed && styles.boxOn, fields.confirm?.length ? styles.boxInvalid : null]}>{confirmed ? <AppText style={styles.tick}>✓</AppText> : null}</View>
        <AppText style={{ flex: 1 }}>I have read this scope and agree to it.</AppText>
      </Pressable>
      {fields.confirm?.length ? <AppText role="alert" style={styles.error}>{fields.confirm.join(" ")}</AppText> : null}
      <Button label="Sign off" busy={sign.isPending} onPress={submit} />
    </Card>
  );
}

const styles = StyleSheet.create({
  check: { flexDirection: "row", alignItems: "center", gap: space.md, minHeight: minTouch },
  box: { width: 28, height: 28, borderRadius: radius.sm, borderWidth: 2, borderColor: colors.slate600, alignItems: "center", justifyContent: "center", backgroundColor: colors.card },
  boxOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  boxInvalid: { borderColor: colors.danger },
  tick: { color: colors.onDark, fontFamily: fonts.bold },
  error: { color: colors.danger, fontFamily: fonts.semibold, fontSize: 14 },
});
