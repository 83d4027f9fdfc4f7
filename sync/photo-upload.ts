// Uploads one photo kept on the phone, reporting progress (fetch cannot report upload progress).
import { ApiError, OfflineError } from "./http";
import type { LocalPhoto } from "./local-store";

export function uploadPhoto(photo: LocalPhoto, onProgress: (fraction: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const form = new FormData();
    form.append("id", photo.id);
    form.append("siteId", photo.siteId);
    if (photo.itemId) form.append("itemId", photo.itemId);
    form.append("label", photo.label);
    form.append("file", new Blob([photo.bytes as BlobPart], { type: photo.mime }), `${photo.id}`);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/photos");
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onerror = () => reject(new OfflineError());
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) return resolve();
      let body = { code: `http_${xhr.status}`, message: `The server answered ${xhr.status}.` };
      try {
        body = JSON.parse(xhr.responseText).error ?? body;
      } catch {
        // not JSON
      }
      if (xhr.status >= 502 && xhr.status <= 504) return reject(new OfflineError());
      reject(new ApiError(xhr.status, body));
    };
    xhr.send(form);
  });
}
