import { useQueryClient } from "@tanstack/react-query";
import { router } from "expo-router";
import { useState } from "react";
import { View } from "react-native";
import * as v from "valibot";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Screen } from "@/components/ui/screen";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { space } from "@/constants/theme";
import { forgetCachedSession, meKeys, useMe, useUpdateName } from "@/hooks/queries/me";
import { UpdateMeSchema } from "@/survey/team";
import { signOut } from "@/sync/auth-client";

const ROLE_WORDS = {
  admin: "Admin: runs the team, its members and settings.",
  designer: "Designer: plans sites and publishes their scope.",
  surveyor: "Surveyor: walks houses and captures what is there.",
  client: "Homeowner: reviews and signs off the scope.",
} as const;

export function AccountScreen() {
  const me = useMe();
  const qc = useQueryClient();
  const update = useUpdateName();
  const [name, setName] = useState(me.user.name ?? "");
  const [errors, setErrors] = useState<string[]>();
  const [saved, setSaved] = useState(false);

  async function save() {
    const parsed = v.safeParse(UpdateMeSchema, { name });
    if (!parsed.success) return setErrors(parsed.issues.map((i) => i.message));
    setErrors(undefined);
    await update.mutateAsync(parsed.output.name);
    setSaved(true);
  }

  async function leave() {
    await signOut().catch(() => {});
    forgetCachedSession();
    qc.clear();
    router.replace("/sign-in");
  }

  return (
    <Screen title="Account" subtitle={me.user.email}>
      <Card>
        <AppText variant="subheading">{me.team.name}</AppText>
        <AppText muted>{ROLE_WORDS[me.role]}</AppText>
      </Card>
      <Card>
        <View style={{ gap: space.md }}>
          {saved ? <Banner tone="good">Your name is saved.</Banner> : null}
          {update.error ? <Banner tone="danger">{update.error.message}</Banner> : null}
          <TextField label="Your name" value={name} onChangeText={(t) => { setName(t); setSaved(false); }} errors={errors} onSubmitEditing={save} />
          <Button label="Save name" tone="secondary" busy={update.isPending} onPress={save} />
        </View>
      </Card>
      <Button label="Sign out" tone="danger" onPress={leave} />
    </Screen>
  );
}
