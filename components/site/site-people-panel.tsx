import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { CheckPress } from "@/components/ui/check-press";
import * as v from "valibot";
import { fieldErrors } from "@/survey/validation";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, fonts, minTouch, radius, space } from "@/constants/theme";
import { useAssignSurveyors, useInviteClient, type SiteSummary } from "@/hooks/queries/sites";
import { useTeamMembers } from "@/hooks/queries/team";
import { InviteClientSchema } from "@/survey/team";
import { ApiError } from "@/sync/http";

/** For designers and admins: who walks this site, and which homeowner signs it. */
export function SitePeoplePanel({ site }: { site: SiteSummary }) {
  const team = useTeamMembers();
  const assign = useAssignSurveyors(site.id);
  const invite = useInviteClient(site.id);
  const [email, setEmail] = useState("");
  const [name, setName] = useState("");
  const [fields, setFields] = useState<Record<string, string[] | undefined>>({});
  const [sent, setSent] = useState<string>();

  const surveyors = team.data?.members.filter((m) => m.role === "surveyor") ?? [];
  const client = team.data?.members.find((m) => m.id === site.clientUserId);

  function toggle(id: string) {
    const next = site.surveyorIds.includes(id) ? site.surveyorIds.filter((s) => s !== id) : [...site.surveyorIds, id];
    assign.mutate(next);
  }

  async function inviteClient() {
    const parsed = v.safeParse(InviteClientSchema, { email, name });
    if (!parsed.success) return setFields(fieldErrors(parsed.issues));
    setFields({});
    try {
      await invite.mutateAsync(parsed.output);
      setSent(parsed.output.email);
      setEmail("");
      setName("");
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
    }
  }

  return (
    <Card>
      <AppText variant="subheading">People on this site</AppText>
      <AppText variant="label">Surveyors who walk it</AppText>
      {assign.error ? <Banner tone="danger">{assign.error.message}</Banner> : null}
      <View style={styles.row} role="group" aria-label="Assigned surveyors">
        {surveyors.length === 0 ? <AppText muted>No surveyors in the team yet. An admin can invite one from Team.</AppText> : null}
        {surveyors.map((s) => {
          const on = site.surveyorIds.includes(s.id);
          return (
            <CheckPress key={s.id} checked={on} label={s.name ?? s.email} onToggle={() => toggle(s.id)} style={StyleSheet.flatten([styles.chip, on && styles.chipOn])}>
              <AppText style={[styles.chipText, on && styles.chipTextOn]}>{`${on ? "✓ " : ""}${s.name ?? s.email}`}</AppText>
            </CheckPress>
          );
        })}
      </View>
      <AppText variant="label" style={{ marginTop: space.sm }}>
        Homeowner who signs the scope
      </AppText>
      <AppText muted>{client ? `${client.name ?? ""} · ${client.email}` : "Nobody invited yet."}</AppText>
      {sent ? <Banner tone="good">{`Invitation sent to ${sent}.`}</Banner> : null}
      {invite.error && !(invite.error instanceof ApiError && Object.keys(invite.error.fields).length) ? <Banner tone="danger">{invite.error.message}</Banner> : null}
      <View style={{ gap: space.md }}>
        <TextField label="Homeowner's name" value={name} onChangeText={setName} errors={fields.name} />
        <TextField label="Homeowner's e-mail" value={email} onChangeText={setEmail} inputMode="email" autoCapitalize="none" errors={fields.email} onSubmitEditing={inviteClient} />
        <Button tone="secondary" label={client ? "Invite a different homeowner" : "Invite the homeowner"} busy={invite.isPending} onPress={inviteClient} />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.sm },
  chip: { minHeight: minTouch - 4, justifyContent: "center", paddingHorizontal: space.lg, borderRadius: radius.pill, borderWidth: 1.5, borderColor: colors.slate100, backgroundColor: colors.card },
  chipOn: { backgroundColor: colors.slate800, borderColor: colors.slate800 },
  chipText: { fontFamily: fonts.semibold, color: colors.slate700 },
  chipTextOn: { color: colors.onDark },
});
