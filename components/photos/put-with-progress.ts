/**
 * The browser's PUT straight to the object store, through XMLHttpRequest because fetch reports
 * no upload progress. Resolves on 2xx; rejects with an UploadError saying what a person can do.
 */
export type UploadFailure = "cancelled" | "store_unreachable" | "store_refused";

export class UploadError extends Error {
  constructor(
    readonly kind: UploadFailure,
    message: string,
  ) {
    super(message);
  }
}

export const STORE_UNREACHABLE = "The photo store is not reachable, so the file was not uploaded. It is still on your device; press Retry in a moment.";

export function putWithProgress(
  url: string,
  file: Blob,
  { headers, onProgress, signal }: { headers: Record<string, string>; onProgress: (loaded: number, total: number) => void; signal: AbortSignal },
): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [name, value] of Object.entries(headers)) xhr.setRequestHeader(name, value);
    xhr.upload.onprogress = (event) => onProgress(event.loaded, event.lengthComputable ? event.total : file.size);
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(file.size, file.size);
        resolve();
      } else if (xhr.status === 403) {
        reject(new UploadError("store_refused", "The upload link was refused or has expired. Press Retry to get a new one."));
      } else {
        reject(new UploadError("store_refused", `The photo store answered ${xhr.status}. Press Retry; if it keeps happening, tell your QC lead.`));
      }
    };
    // A network error (store down, connection lost) never reaches onload.
    xhr.onerror = () => reject(new UploadError("store_unreachable", STORE_UNREACHABLE));
    xhr.ontimeout = xhr.onerror;
    xhr.onabort = () => reject(new UploadError("cancelled", "Cancelled."));
    if (signal.aborted) return xhr.abort();
    signal.addEventListener("abort", () => xhr.abort(), { once: true });
    xhr.send(file);
  });
}
