import { useMutation, useQueryClient } from "@tanstack/react-query";
import { z } from "zod";
import { ApiErrorSchema } from "@shared/schemas/error";
import { ReadingImportResultSchema, type ReadingImportResult } from "@shared/schemas/readings";
import { api, ApiError } from "@/lib/api-client";
import { stewardKeys } from "./keys";

export interface UploadProgress {
  loaded: number;
  total: number;
}

/**
 * `POST /api/digesters/:id/readings/import` (multipart, field `file`). XMLHttpRequest rather
 * than fetch, because only XHR reports upload progress; the answer and its errors are read into
 * the same shapes as every other API call.
 */
export async function uploadSensorLog(
  { digesterId, file }: { digesterId: number; file: File },
  onProgress: (progress: UploadProgress) => void,
): Promise<ReadingImportResult> {
  const { token } = await api("/api/auth/csrf", { schema: z.object({ token: z.string() }) });
  const form = new FormData();
  form.append("file", file, file.name);
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/digesters/${digesterId}/readings/import`);
    xhr.setRequestHeader("Accept", "application/json");
    xhr.setRequestHeader("x-csrf-token", token);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress({ loaded: event.loaded, total: event.total });
    };
    xhr.onerror = () =>
      reject(new ApiError(0, "network", "The upload did not reach Hearthloop. Check your connection and try again."));
    xhr.onload = () => {
      let json: unknown;
      try {
        json = JSON.parse(xhr.responseText);
      } catch {
        json = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        const parsed = ReadingImportResultSchema.safeParse(json);
        if (parsed.success) resolve(parsed.data);
        else reject(new ApiError(xhr.status, "bad_answer", "The server's answer could not be read."));
        return;
      }
      const error = ApiErrorSchema.safeParse(json);
      reject(
        error.success
          ? new ApiError(xhr.status, error.data.error.code, error.data.error.message, error.data.error.fields ?? {})
          : new ApiError(xhr.status, "http_error", `The server answered ${xhr.status}.`),
      );
    };
    xhr.send(form);
  });
}

export function useUploadSensorLog(onProgress: (progress: UploadProgress) => void, onChanged?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { digesterId: number; file: File }) => uploadSensorLog(input, onProgress),
    onSuccess: async () => {
      onChanged?.();
      await queryClient.invalidateQueries({ queryKey: stewardKeys.all });
    },
  });
}
