/**
 * The one way the client talks to the API: JSON in, zod-parsed JSON out, and a typed error
 * on any non-2xx answer carrying the server's error shape.
 */
import type { z } from "zod";
import { ApiErrorSchema } from "@shared/schemas/error";

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
    this.name = "ApiError";
  }
}

let csrfToken: string | undefined;
export function setCsrfToken(token: string | undefined) {
  csrfToken = token;
}

export interface RequestOptions<T extends z.ZodType> {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown;
  schema?: T;
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

export async function api<T extends z.ZodType>(url: string, options: RequestOptions<T> = {}): Promise<z.output<T>> {
  const method = options.method ?? "GET";
  const headers: Record<string, string> = { Accept: "application/json", ...options.headers };
  if (options.body !== undefined) headers["Content-Type"] = "application/json";
  if (method !== "GET" && csrfToken) headers["x-csrf-token"] = csrfToken;
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      credentials: "same-origin",
      signal: options.signal,
    });
  } catch (err) {
    if ((err as Error).name === "AbortError") throw err;
    throw new ApiError(0, "network", "Could not reach Hearthloop. Check your connection and try again.");
  }
  const text = await res.text();
  const json: unknown = text ? safeJson(text) : undefined;
  if (!res.ok) {
    const parsed = ApiErrorSchema.safeParse(json);
    if (parsed.success) {
      const e = parsed.data.error;
      throw new ApiError(res.status, e.code, e.message, e.fields ?? {});
    }
    throw new ApiError(res.status, "http_error", `The server answered ${res.status}.`);
  }
  return options.schema ? options.schema.parse(json) : (json as z.output<T>);
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}
