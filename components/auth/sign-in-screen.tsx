import { useQueryClient } from "@tanstack/react-query";
import { router, useLocalSearchParams } from "expo-router";
import { useState } from "react";
import { View } from "react-native";
import * as v from "valibot";
import { fieldErrors } from "@/survey/validation";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { TextField } from "@/components/ui/text-field";
import { space } from "@/constants/theme";
import { meKeys } from "@/hooks/queries/me";
import { EmailSchema, SignInSchema } from "@/survey/team";
import { requestSignInLink, signInErrorMessage, signInWithPassword } from "@/sync/auth-client";
import { AuthFrame } from "./auth-frame";

type Mode = "team" | "homeowner";

/** Auth.js's errors for e-mailed links: a link expired or already used, or an address not invited. */
const LINK_ERRORS = new Set(["Verification", "AccessDenied"]);
type Fields = Record<string, string[] | undefined>;

export function SignInScreen() {
  const params = useLocalSearchParams<{ email?: string; error?: string }>();
  const qc = useQueryClient();
  // A homeowner arrives here from an e-mailed link (with their address, or with the error of a used or
  // refused link): open on the form that sends them a new link.
  const [mode, setMode] = useState<Mode>(params.email || LINK_ERRORS.has(params.error ?? "") ? "homeowner" : "team");
  const [email, setEmail] = useState(params.email ?? "");
  const [password, setPassword] = useState("");
  const [fields, setFields] = useState<Fields>({});
  const [message, setMessage] = useState<string | undefined>(signInErrorMessage(params.error));
  const [sentTo, setSentTo] = useState<string>();
  const [busy, setBusy] = useState(false);

  async function submitPassword() {
    const parsed = v.safeParse(SignInSchema, { email, password });
    if (!parsed.success) return setFields(fieldErrors(parsed.issues));
    setFields({});
    setBusy(true);
    try {
      const result = await signInWithPassword(parsed.output.email, parsed.output.password);
      if (!result.ok) return setMessage(result.message);
      await qc.invalidateQueries({ queryKey: meKeys.root });
      router.replace("/");
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "Signing in did not work. Check your connection and try again.");
    } finally {
      setBusy(false);
    }
  }

  async function submitLink() {
    const parsed = v.safeParse(EmailSchema, email);
    if (!parsed.success) return setFields({ email: parsed.issues.map((i) => i.message) });
    setFields({});
    setBusy(true);
    try {
      const result = await requestSignInLink(parsed.output);
      if (!result.ok) return setMessage(result.message);
      setMessage(undefined);
      setSentTo(parsed.output);
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "We could not send the link. Check your connection and try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <AuthFrame title="Sign in" subtitle={mode === "team" ? "For the installer's team: surveyors, designers and admins." : "For homeowners: we e-mail you a link, no password needed."}>
      <ChoiceChips
        label="Who is signing in?"
        value={mode}
        onChange={(m) => {
          setMode(m);
          setMessage(undefined);
          setFields({});
          setSentTo(undefined);
        }}
        choices={[
          { value: "team", label: "I'm on the team" },
          { value: "homeowner", label: "I'm the homeowner" },
        ]}
      />
      {message ? <Banner tone="danger">{message}</Banner> : null}
      {sentTo ? (
        <Banner tone="good" title="Check your e-mail">{`We sent a sign-in link to ${sentTo}. It works once, for 15 minutes.`}</Banner>
      ) : null}
      <View style={{ gap: space.md }}>
        <TextField
          label="E-mail"
          value={email}
          onChangeText={setEmail}
          autoComplete="email"
          inputMode="email"
          autoCapitalize="none"
          errors={fields.email}
          onSubmitEditing={mode === "team" ? undefined : submitLink}
        />
        {mode === "team" ? (
          <TextField label="Password" value={password} onChangeText={setPassword} secureTextEntry autoComplete="current-password" errors={fields.password} onSubmitEditing={submitPassword} />
        ) : null}
        {mode === "team" ? <Button label="Sign in" busy={busy} onPress={submitPassword} /> : <Button label="Send me a link" busy={busy} onPress={submitLink} />}
      </View>
    </AuthFrame>
  );
}
