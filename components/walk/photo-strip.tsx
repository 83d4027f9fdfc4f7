import { useState } from "react";
import { Image, StyleSheet, View } from "react-native";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ChoiceChips } from "@/components/ui/choice-chips";
import { AppText } from "@/components/ui/text";
import { colors, radius, space } from "@/constants/theme";
import { pickPhoto, usePhotoUri } from "@/hooks/use-photos";
import { PHOTO_LABEL_WORDS, PHOTO_LABELS, type PhotoLabel } from "@/survey/walk/words";
import type { LocalPhoto } from "@/sync/local-store";

function Thumb({ photo }: { photo: LocalPhoto }) {
  const uri = usePhotoUri(photo);
  const words = PHOTO_LABEL_WORDS[photo.label as PhotoLabel] ?? photo.label;
  return (
    <View style={styles.thumb}>
      {uri ? <Image source={{ uri }} style={styles.image} accessibilityLabel={`Photo: ${words}`} resizeMode="cover" /> : <View style={styles.image} />}
      <AppText variant="caption" numberOfLines={1} style={{ maxWidth: 96 }}>
        {words}
      </AppText>
      {!photo.uploaded ? (
        <AppText variant="caption" muted>
          on this phone
        </AppText>
      ) : null}
    </View>
  );
}

/** Thumbnails of photos, and (with `itemId`) picking a new one with what it shows. */
export function PhotoStrip({ photos, itemId, addPhoto, emptyText }: { photos: readonly LocalPhoto[]; itemId?: string; addPhoto?: (p: { itemId: string | null; label: string; mime: string; bytes: Uint8Array }) => Promise<unknown>; emptyText: string }) {
  const [label, setLabel] = useState<PhotoLabel>("mount_point");
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  async function add() {
    if (!addPhoto || !itemId) return;
    setProblem(null);
    setBusy(true);
    try {
      const picked = await pickPhoto();
      if (!picked) return;
      if ("problem" in picked) return setProblem(picked.problem);
      await addPhoto({ itemId, label, mime: picked.mime, bytes: picked.bytes });
    } catch (err) {
      setProblem(`The photo could not be kept: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      setBusy(false);
    }
  }

  return (
    <View style={{ gap: space.md }}>
      {photos.length ? (
        <View style={styles.row} role="list" aria-label="Photos">
          {photos.map((p) => (
            <View key={p.id} role="listitem">
              <Thumb photo={p} />
            </View>
          ))}
        </View>
      ) : (
        <AppText muted>{emptyText}</AppText>
      )}
      {addPhoto && itemId ? (
        <>
          <ChoiceChips label="The photo shows" value={label} choices={PHOTO_LABELS.map((value) => ({ value, label: PHOTO_LABEL_WORDS[value] }))} onChange={setLabel} />
          {problem ? <Banner tone="danger">{problem}</Banner> : null}
          <Button tone="secondary" label="Add photo" busy={busy} onPress={add} style={{ alignSelf: "flex-start" }} />
        </>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: "row", flexWrap: "wrap", gap: space.md },
  thumb: { gap: 2 },
  image: { width: 96, height: 96, borderRadius: radius.md, backgroundColor: colors.slate100 },
});
