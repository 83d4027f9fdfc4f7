import { useState } from "react";
import { StyleSheet, View } from "react-native";
import { when } from "@/components/ui/format";
import * as v from "valibot";
import { fieldErrors } from "@/survey/validation";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmBox } from "@/components/ui/confirm-box";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { colors, space } from "@/constants/theme";
import { useMe } from "@/hooks/queries/me";
import { useChangeRole, useInviteMember, useRemoveMember, useRevokeInvite, useTeamMembers } from "@/hooks/queries/team";
import type { TeamRole } from "@/survey/policy";
import { InviteMemberSchema } from "@/survey/team";
import { ApiError } from "@/sync/http";
import { OutboxPanel } from "./outbox-panel";

const ROLE_CHOICES: { value: TeamRole; label: string }[] = [
  { value: "admin", label: "Admin" },
  { value: "designer", label: "Designer" },
  { value: "surveyor", label: "Surveyor" },
];

export function TeamScreen() {
  const me = useMe();
  const team = useTeamMembers(me.permissions["team:read-members"]);
  const changeRole = useChangeRole();
  const remove = useRemoveMember();
  const revoke = useRevokeInvite();
  const inviteMember = useInviteMember();
  const [email, setEmail] = useState("");
  const [role, setRole] = useState<TeamRole>("surveyor");
  const [fields, setFields] = useState<Record<string, string[] | undefined>>({});
  const [sent, setSent] = useState<string>();
  // The member whose Remove was pressed: it asks once more before they lose access.
  const [removing, setRemoving] = useState<string | null>(null);

  if (!me.permissions["team:manage"]) {
    return (
      <Screen title="Team">
        <Banner tone="warn">Only your team's admin manages members.</Banner>
      </Screen>
    );
  }

  async function invite() {
    const parsed = v.safeParse(InviteMemberSchema, { email, role });
    if (!parsed.success) return setFields(fieldErrors(parsed.issues));
    setFields({});
    try {
      await inviteMember.mutateAsync(parsed.output);
      setSent(parsed.output.email);
      setEmail("");
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
    }
  }

  const mutationError = changeRole.error ?? remove.error ?? revoke.error;
  const staff = team.data?.members.filter((m) => m.role !== "client") ?? [];
  const clients = team.data?.members.filter((m) => m.role === "client") ?? [];

  return (
    <Screen title="Team" subtitle={me.team.name}>
      {mutationError ? <Banner tone="danger">{mutationError.message}</Banner> : null}
      <Card>
        <AppText variant="subheading">Invite someone</AppText>
        {sent ? <Banner tone="good">{`Invitation sent to ${sent}. It works once, for 7 days.`}</Banner> : null}
        {inviteMember.error && !Object.keys(fields).length ? <Banner tone="danger">{inviteMember.error.message}</Banner> : null}
        <View style={{ gap: space.md }}>
          <TextField label="E-mail" value={email} onChangeText={setEmail} inputMode="email" autoCapitalize="none" errors={fields.email} onSubmitEditing={invite} />
          <ChoiceChips label="Role" value={role} onChange={setRole} choices={ROLE_CHOICES} errors={fields.role} />
          <Button label="Send invitation" busy={inviteMember.isPending} onPress={invite} />
        </View>
      </Card>

      <View style={{ gap: space.sm }}>
        <AppText variant="heading">Members</AppText>
        {staff.map((m) => (
          <Card key={m.id}>
            <View style={styles.memberHead}>
              <View style={{ flex: 1 }}>
                <AppText variant="subheading">{m.name ?? m.email}</AppText>
                <AppText muted variant="caption">{m.email}</AppText>
              </View>
              {m.id !== me.user.id ? <Button tone="quiet" label={`Remove ${m.name ?? m.email}`} onPress={() => setRemoving(removing === m.id ? null : m.id)} /> : <AppText muted>You</AppText>}
            </View>
            {removing === m.id ? (
              <ConfirmBox
                question={`Remove ${m.name ?? m.email} from the team?`}
                detail="They lose access to the team's sites at once. What they have synced stays on the sites; changes still only on their phone no longer reach the team, so ask them to sync first."
                confirmLabel="Yes, remove them"
                // A refusal shows in the screen's banner (mutationError).
                onConfirm={() => remove.mutateAsync(m.id).catch(() => undefined)}
                onClose={() => setRemoving(null)}
              />
            ) : null}
            <ChoiceChips label={`Role of ${m.name ?? m.email}`} value={m.role as TeamRole} choices={ROLE_CHOICES} onChange={(r) => changeRole.mutate({ id: m.id, role: r })} />
          </Card>
        ))}
      </View>

      {team.data?.invites.length ? (
        <View style={{ gap: space.sm }}>
          <AppText variant="heading">Waiting to join</AppText>
          {team.data.invites.map((i) => (
            <Card key={i.id}>
              <View style={styles.memberHead}>
                <View style={{ flex: 1 }}>
                  <AppText>{i.email}</AppText>
                  <AppText muted variant="caption">{`${i.role} · expires ${when(i.expiresAt)}`}</AppText>
                </View>
                <Button tone="quiet" label={`Withdraw invitation for ${i.email}`} onPress={() => revoke.mutate(i.id)} />
              </View>
            </Card>
          ))}
        </View>
      ) : null}

      {clients.length ? (
        <View style={{ gap: space.sm }}>
          <AppText variant="heading">Homeowners</AppText>
          <AppText muted>Invited to their own site by a designer; they sign in by e-mailed link.</AppText>
          {clients.map((c) => (
            <AppText key={c.id} style={{ color: colors.ink }}>{`${c.name ?? ""} · ${c.email}`}</AppText>
          ))}
        </View>
      ) : null}

      <OutboxPanel />
    </Screen>
  );
}

const styles = StyleSheet.create({
  memberHead: { flexDirection: "row", alignItems: "center", gap: space.md },
});
