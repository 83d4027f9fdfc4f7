// What a file really is, from its first bytes: the browser's declared type is whatever the client says.
export type ImageType = "image/jpeg" | "image/png" | "image/webp" | "image/heic";

export function sniffImage(bytes: Uint8Array): ImageType | undefined {
  const at = (i: number, ...values: number[]) => values.every((v, k) => bytes[i + k] === v);
  const ascii = (i: number, text: string) => [...text].every((c, k) => bytes[i + k] === c.charCodeAt(0));
  if (bytes.length < 12) return undefined;
  if (at(0, 0xff, 0xd8, 0xff)) return "image/jpeg";
  if (at(0, 0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return "image/png";
  if (ascii(0, "RIFF") && ascii(8, "WEBP")) return "image/webp";
  if (ascii(4, "ftyp") && ["heic", "heix", "mif1", "msf1", "heim", "heis"].some((brand) => ascii(8, brand))) return "image/heic";
  return undefined;
}

export const IMAGE_EXTENSION: Record<ImageType, string> = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp", "image/heic": "heic" };
