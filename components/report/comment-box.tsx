import { useState } from "react";
import { View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { TextField } from "@/components/ui/text-field";
import { space } from "@/constants/theme";
import { useAddComment } from "@/hooks/queries/reports";
import { ApiError } from "@/sync/http";

/** Comment on one item of the scope, or ask for a change to it (homeowners only). */
export function CommentBox({ reportId, itemRef, itemName, canAskChange, onDone }: { reportId: string; itemRef: string; itemName: string; canAskChange: boolean; onDone: () => void }) {
  const add = useAddComment(reportId);
  const [body, setBody] = useState("");
  const [kind, setKind] = useState<"comment" | "change">("comment");
  const [errors, setErrors] = useState<string[]>();

  async function send() {
    if (!body.trim()) return setErrors(["Write the comment."]);
    setErrors(undefined);
    try {
      await add.mutateAsync({ itemRef, body: body.trim(), changeRequest: kind === "change" });
      setBody("");
      onDone();
    } catch (err) {
      if (err instanceof ApiError) setErrors(err.fields.body ?? [err.message]);
    }
  }

  return (
    <View style={{ gap: space.sm }}>
      {canAskChange ? (
        <ChoiceChips
          label={`About ${itemName}`}
          value={kind}
          onChange={setKind}
          choices={[
            { value: "comment", label: "Comment" },
            { value: "change", label: "Ask for a change" },
          ]}
        />
      ) : null}
      {add.error && !(add.error instanceof ApiError) ? <Banner tone="danger">Could not send. Check your connection and try again.</Banner> : null}
      <TextField label={`Your comment on ${itemName}`} value={body} onChangeText={setBody} multiline errors={errors} />
      <View style={{ flexDirection: "row", gap: space.sm }}>
        <Button label={kind === "change" ? "Ask for this change" : "Send comment"} busy={add.isPending} onPress={send} />
        <Button label="Cancel" tone="quiet" onPress={onDone} />
      </View>
    </View>
  );
}
