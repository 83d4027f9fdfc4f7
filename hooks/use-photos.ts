// Photos of a walk: a viewable address for each (the bytes kept on this phone, or the server's
// copy), and picking a new one with the document picker (on a phone's browser it offers the camera).
import * as DocumentPicker from "expo-document-picker";
import { useEffect, useRef, useState } from "react";
import type { LocalPhoto } from "@/sync/local-store";

/** Photos kept on the phone show from their bytes; photos from the server through the API. */
export function usePhotoUri(photo: LocalPhoto): string | null {
  const bytes = useRef(photo.bytes);
  bytes.current = photo.bytes;
  const local = photo.bytes !== null;
  const [uri, setUri] = useState<string | null>(null);
  useEffect(() => {
    if (!local || !bytes.current) {
      setUri(`/api/photos/${encodeURIComponent(photo.id)}`);
      return;
    }
    const url = URL.createObjectURL(new Blob([bytes.current as BlobPart], { type: photo.mime }));
    setUri(url);
    return () => URL.revokeObjectURL(url);
  }, [photo.id, photo.mime, local]);
  return uri;
}

/** The server's default upload limit (`maxPhotoBytes`): a bigger photo is refused at once, on the phone. */
export const MAX_PHOTO_BYTES = 12 * 1024 * 1024;

export type PickedPhoto = { mime: string; bytes: Uint8Array } | { problem: string } | null;

/** Opens the picker for one image; null when the surveyor cancels. */
export async function pickPhoto(): Promise<PickedPhoto> {
  const result = await DocumentPicker.getDocumentAsync({ type: "image/*", base64: false, copyToCacheDirectory: false });
  if (result.canceled || !result.assets?.length) return null;
  const asset = result.assets[0];
  try {
    const mime = asset.mimeType ?? asset.file?.type ?? "";
    if (!mime.startsWith("image/")) return { problem: `“${asset.name}” is not a photo (${mime || "unknown type"}). Pick an image.` };
    const size = asset.size ?? asset.file?.size ?? 0;
    if (size > MAX_PHOTO_BYTES) return { problem: `“${asset.name}” is ${Math.round(size / 1024 / 1024)} MB; photos can be at most ${MAX_PHOTO_BYTES / 1024 / 1024} MB.` };
    const buffer = asset.file ? await asset.file.arrayBuffer() : await (await fetch(asset.uri)).arrayBuffer();
    return { mime, bytes: new Uint8Array(buffer) };
  } finally {
    if (asset.uri.startsWith("blob:")) URL.revokeObjectURL(asset.uri);
  }
}
