/**
 * Multipart uploads with progress. `fetch` cannot report upload progress, so this uses XMLHttpRequest,
 * with the same CSRF token, error shape (ApiError) and one retry on a stale token as `api()`.
 */
import { ApiError, apiErrorFrom, getCsrfToken, isCsrfRefusal, resetCsrfToken } from "@/lib/api-client";

export type UploadOptions = {
  /** Called with the fraction sent, 0–1. */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
  /** POST by default; PUT replaces a single file (the company logo). */
  method?: "POST" | "PUT";
};

function sendOnce<T>(path: string, form: FormData, token: string, { onProgress, signal, method = "POST" }: UploadOptions): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    if (signal?.aborted) {
      reject(new DOMException("The upload was cancelled", "AbortError"));
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open(method, `/api${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader("Accept", "application/json");
    xhr.setRequestHeader("X-CSRF-Token", token);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress?.(Math.min(1, e.loaded / e.total));
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        body = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress?.(1);
        resolve(body as T);
      } else reject(apiErrorFrom(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, "network", "The upload did not reach the server. Check your connection and try again."));
    xhr.onabort = () => reject(new DOMException("The upload was cancelled", "AbortError"));
    signal?.addEventListener("abort", () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Sends `form` (POST, or PUT) to `/api${path}`; resolves with the parsed JSON body, rejects with ApiError. */
export async function uploadFiles<T>(path: string, form: FormData, options: UploadOptions = {}): Promise<T> {
  try {
    return await sendOnce<T>(path, form, await getCsrfToken(), options);
  } catch (err) {
    if (!(err instanceof ApiError) || !isCsrfRefusal(err)) throw err;
    // the session (and its token) changed under us: fetch a fresh token and send again
    resetCsrfToken();
    options.onProgress?.(0);
    return sendOnce<T>(path, form, await getCsrfToken(), options);
  }
}
