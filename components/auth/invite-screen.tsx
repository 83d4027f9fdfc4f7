import { useQuery } from "@tanstack/react-query";
import { router, useLocalSearchParams } from "expo-router";
import { useState } from "react";
import { ActivityIndicator, View } from "react-native";
import * as v from "valibot";
import { fieldErrors } from "@/survey/validation";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { TextField } from "@/components/ui/text-field";
import { AppText } from "@/components/ui/text";
import { colors, space } from "@/constants/theme";
import { AcceptInviteSchema } from "@/survey/team";
import { signInWithPassword } from "@/sync/auth-client";
import { ApiError, apiFetch } from "@/sync/http";
import { useQueryClient } from "@tanstack/react-query";
import { meKeys } from "@/hooks/queries/me";
import { AuthFrame } from "./auth-frame";

interface InviteInfo {
  email: string;
  role: string;
  teamName: string;
}

export function InviteScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  const qc = useQueryClient();
  const invite = useQuery({ queryKey: ["invite", token], queryFn: () => apiFetch<{ invite: InviteInfo }>(`/api/invites/${token}`).then((r) => r.invite), retry: false });
  const [name, setName] = useState("");
  const [password, setPassword] = useState("");
  const [fields, setFields] = useState<Record<string, string[] | undefined>>({});
  const [message, setMessage] = useState<string>();
  const [busy, setBusy] = useState(false);

  async function accept() {
    const parsed = v.safeParse(AcceptInviteSchema, { name, password });
    if (!parsed.success) return setFields(fieldErrors(parsed.issues));
    setFields({});
    setBusy(true);
    try {
      await apiFetch(`/api/invites/${token}/accept`, { body: parsed.output });
      const signedIn = await signInWithPassword(invite.data!.email, parsed.output.password);
      if (!signedIn.ok) return setMessage(signedIn.message);
      await qc.invalidateQueries({ queryKey: meKeys.root });
      router.replace("/");
    } catch (err) {
      if (err instanceof ApiError) {
        setFields(err.fields);
        setMessage(err.message);
      } else setMessage("Could not reach Dropwise. Check your connection and try again.");
    } finally {
      setBusy(false);
    }
  }

  if (invite.isPending) {
    return (
      <AuthFrame title="Your invitation">
        <ActivityIndicator color={colors.slate800} aria-label="Loading" />
      </AuthFrame>
    );
  }
  if (invite.isError) {
    return (
      <AuthFrame title="This invitation can't be used">
        <Banner tone="danger">{invite.error instanceof ApiError ? invite.error.message : "Could not reach Dropwise. Check your connection and reload."}</Banner>
        <Button tone="secondary" label="Go to sign-in" onPress={() => router.replace("/sign-in")} />
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title={`Join ${invite.data.teamName}`} subtitle={`You were invited as a ${invite.data.role}. Choose the name your team sees and a password.`}>
      {message ? <Banner tone="danger">{message}</Banner> : null}
      <View style={{ gap: space.md }}>
        <AppText muted>{`You will sign in as ${invite.data.email}.`}</AppText>
        <TextField label="Your name" value={name} onChangeText={setName} autoComplete="name" errors={fields.name} />
        <TextField label="Password" value={password} onChangeText={setPassword} secureTextEntry autoComplete="new-password" hint="At least 10 characters." errors={fields.password} onSubmitEditing={accept} />
        <Button label="Join the team" busy={busy} onPress={accept} />
      </View>
    </AuthFrame>
  );
}
