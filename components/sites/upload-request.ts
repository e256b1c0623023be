/** A multipart upload with XMLHttpRequest, which (unlike fetch) reports upload progress; errors as ApiError. */
import type { z } from 'zod';
import { ApiError, apiErrorFrom, networkErrorStatus } from '../api/api-error';

export type UploadProgress = { loadedBytes: number; totalBytes: number; fraction: number };

type UploadRequest<S extends z.ZodType> = {
  url: string;
  form: FormData;
  schema: S;
  onProgress?: (p: UploadProgress) => void;
  signal?: AbortSignal;
  /** A more specific error for some refusals (e.g. a duplicate with the existing id); null for the usual ApiError. */
  interpretError?: (status: number, body: unknown) => Error | null;
  /** For tests: the XMLHttpRequest constructor (the browser's by default). */
  Xhr?: typeof XMLHttpRequest;
};

/** Resolves with the parsed answer; rejects with the server's error (its message word for word) or a network error. */
export function uploadWithProgress<S extends z.ZodType>(req: UploadRequest<S>): Promise<z.infer<S>> {
  const Xhr = req.Xhr ?? XMLHttpRequest;
  return new Promise((resolve, reject) => {
    const xhr = new Xhr();
    xhr.open('POST', req.url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (!e.lengthComputable || !req.onProgress) return;
      req.onProgress({ loadedBytes: e.loaded, totalBytes: e.total, fraction: e.total > 0 ? e.loaded / e.total : 0 });
    };
    xhr.onerror = () => reject(new ApiError(networkErrorStatus, 'network', 'The upload did not reach the Loftline server. Check the connection and try again.'));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    xhr.onload = () => {
      let json: unknown = undefined;
      try {
        json = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        json = undefined;
      }
      if (xhr.status < 200 || xhr.status >= 300) return reject(req.interpretError?.(xhr.status, json) ?? apiErrorFrom(xhr.status, json));
      const parsed = req.schema.safeParse(json);
      if (!parsed.success) return reject(new ApiError(xhr.status, 'contract_mismatch', `The server's answer to the upload did not match the expected shape.`));
      resolve(parsed.data);
    };
    req.signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(req.form);
  });
}
