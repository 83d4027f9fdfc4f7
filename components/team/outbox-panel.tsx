import { Linking, View } from "react-native";
import { Card } from "@/components/ui/card";
import { when } from "@/components/ui/format";
import { AppText } from "@/components/ui/text";
import { Icon } from "@/components/ui/icons";
import { colors, space } from "@/constants/theme";
import { useOutbox } from "@/hooks/queries/team";
import { ApiError } from "@/sync/http";

/** An e-mailed sign-in link works once (Auth.js's e-mail callback). */
function isOneTimeSignIn(link: string): boolean {
  return link.includes("/auth/callback/");
}

/** Development: the mail the local SMTP sink captured in place of a real mail service. */
export function OutboxPanel() {
  const outbox = useOutbox();
  if (outbox.error instanceof ApiError && outbox.error.status === 404) return null; // a real SMTP provider is set
  return (
    <View style={{ gap: space.sm }}>
      <View style={{ flexDirection: "row", alignItems: "center", gap: space.sm }}>
        <Icon name="mail" color={colors.slate700} />
        <AppText variant="heading">Outbox</AppText>
      </View>
      <AppText muted>No mail service is configured, so messages stop here instead of being delivered. Links work as they would in the e-mail.</AppText>
      {outbox.data?.length === 0 ? <AppText muted>Nothing sent yet.</AppText> : null}
      {outbox.data?.map((m) => (
        <Card key={m.id}>
          <AppText variant="label">{m.subject}</AppText>
          <AppText muted variant="caption">{`to ${m.to} · ${when(m.receivedAt)}`}</AppText>
          {m.links.map((l) => (
            <View key={l} style={{ gap: 2 }}>
              {isOneTimeSignIn(l) ? (
                <AppText variant="caption" style={{ color: colors.warn }}>
                  {`A one-time sign-in link for ${m.to}: opening it in this browser uses it up and keeps you signed in as yourself. To act as them, open it in a private window.`}
                </AppText>
              ) : null}
              <AppText role="link" onPress={() => Linking.openURL(l)} style={{ color: colors.copper700, textDecorationLine: "underline" }}>
                {l}
              </AppText>
            </View>
          ))}
        </Card>
      ))}
    </View>
  );
}
