import { useState } from "react";
import { Linking, StyleSheet, View } from "react-native";
import { CheckPress } from "@/components/ui/check-press";
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
  const [despite, setDespite] = useState(false);
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

  // Changes the homeowner asked for on this version stay open until a new version answers them.
  const asked = view.comments.filter((c) => c.changeRequest);
  const names = new Map(view.content.rooms.flatMap((r) => r.devices).map((d) => [d.id, d.name]));
  const askedAbout = [...new Set(asked.map((c) => (c.itemRef === "general" ? "the whole scope" : names.get(c.itemRef) ?? c.itemRef)))];

  async function submit() {
    const next: Record<string, string[]> = {};
    if (name.trim().length < 2) next.typedName = ["Type your full name."];
    if (!confirmed) next.confirm = ["Tick the box to confirm you agree to this scope."];
    if (asked.length > 0 && !despite) next.despiteChangeRequests = [`Tick to sign version ${view.report.version} as it is, without the changes you asked for — or wait for your installer's new version.`];
    setFields(next);
    if (Object.keys(next).length) return;
    try {
      const result = await sign.mutateAsync({ typedName: name.trim(), confirm: true, ...(asked.length > 0 ? { despiteChangeRequests: true } : {}) });
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
      <CheckPress checked={confirmed} label="I have read this scope and agree to it" onToggle={() => setConfirmed(!confirmed)} style={styles.check}>
        <View style={[styles.box, confirmed && styles.boxOn, fields.confirm?.length ? styles.boxInvalid : null]}>{confirmed ? <AppText style={styles.tick}>✓</AppText> : null}</View>
        <AppText style={{ flex: 1 }}>I have read this scope and agree to it.</AppText>
      </CheckPress>
      {fields.confirm?.length ? <AppText role="alert" style={styles.error}>{fields.confirm.join(" ")}</AppText> : null}
      {asked.length > 0 ? (
        <View style={{ gap: space.sm }}>
          <Banner tone="warn" title={asked.length === 1 ? "You asked for a change" : `You asked for ${asked.length} changes`}>
            {`About ${askedAbout.join(", ")}. Your installer answers with a new version of the scope; signing this one agrees to it as it is, without ${asked.length === 1 ? "that change" : "those changes"}.`}
          </Banner>
          <CheckPress checked={despite} label="Sign this version as it is, without the changes I asked for" onToggle={() => setDespite(!despite)} style={styles.check}>
            <View style={[styles.box, despite && styles.boxOn, fields.despiteChangeRequests?.length ? styles.boxInvalid : null]}>{despite ? <AppText style={styles.tick}>✓</AppText> : null}</View>
            <AppText style={{ flex: 1 }}>Sign this version as it is, without the changes I asked for.</AppText>
          </CheckPress>
          {fields.despiteChangeRequests?.length ? <AppText role="alert" style={styles.error}>{fields.despiteChangeRequests.join(" ")}</AppText> : null}
        </View>
      ) : null}
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
