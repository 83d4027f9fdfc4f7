import { router } from "expo-router";
import { useState } from "react";
import { View } from "react-native";
import * as v from "valibot";
import { fieldErrors } from "@/survey/validation";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { AppText } from "@/components/ui/text";
import { TextField } from "@/components/ui/text-field";
import { space } from "@/constants/theme";
import { useCreateSite } from "@/hooks/queries/sites";
import { CreateSiteSchema } from "@/survey/team";
import { ApiError } from "@/sync/http";

export function NewSiteForm({ onDone }: { onDone: () => void }) {
  const create = useCreateSite();
  const [name, setName] = useState("");
  const [address, setAddress] = useState("");
  const [units, setUnits] = useState<"metric" | "imperial">("metric");
  const [fields, setFields] = useState<Record<string, string[] | undefined>>({});

  async function submit() {
    const parsed = v.safeParse(CreateSiteSchema, { name, address, units });
    if (!parsed.success) return setFields(fieldErrors(parsed.issues));
    setFields({});
    try {
      const site = await create.mutateAsync(parsed.output);
      onDone();
      router.push(`/sites/${site.id}`);
    } catch (err) {
      if (err instanceof ApiError) setFields(err.fields);
    }
  }

  return (
    <Card>
      <AppText variant="subheading">New site</AppText>
      {create.error ? <Banner tone="danger">{create.error.message}</Banner> : null}
      <View style={{ gap: space.md }}>
        <TextField label="Site name" placeholder="e.g. The Marsh-Oduya house" value={name} onChangeText={setName} errors={fields.name} />
        <TextField label="Address" value={address} onChangeText={setAddress} errors={fields.address} onSubmitEditing={submit} />
        <ChoiceChips label="Units on the walk" value={units} onChange={setUnits} choices={[{ value: "metric", label: "Metric (m)" }, { value: "imperial", label: "Imperial (ft)" }]} />
        <View style={{ flexDirection: "row", gap: space.sm, flexWrap: "wrap" }}>
          <Button label="Create site" busy={create.isPending} onPress={submit} />
          <Button label="Cancel" tone="quiet" onPress={onDone} />
        </View>
      </View>
    </Card>
  );
}
