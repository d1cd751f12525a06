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
let csrfRequest: Promise<string> | undefined;

/** Sets (or forgets, with undefined) the CSRF token; sign-in and sign-out start a new session, so forget it then. */
export function setCsrfToken(token: string | undefined) {
  csrfToken = token;
}

/**
 * Fetches the CSRF token once, however many requests ask at the same time: the session's when someone is signed in,
 * else a visitor's signed token whose cookie the same answer sets (no session is stored before sign-in).
 */
function fetchCsrfToken(): Promise<string> {
  csrfRequest ??= fetch("/api/auth/csrf", { headers: { Accept: "application/json" }, credentials: "same-origin" })
    .then(async (res) => {
      const body = (await res.json().catch(() => undefined)) as { token?: unknown } | undefined;
      if (!res.ok || typeof body?.token !== "string")
        throw new ApiError(res.status, "csrf_unavailable", "Could not start a secure session. Reload the page.");
      csrfToken = body.token;
      return body.token;
    })
    .finally(() => {
      csrfRequest = undefined;
    });
  return csrfRequest;
}

type SessionListener = (expiresAt: number) => void;
const sessionListeners = new Set<SessionListener>();
let lastSessionExpiry: number | undefined;

/**
 * Calls `listener` with the client-clock time (ms) at which the signed-in session ends, read
 * from the `X-Session-Expires-In` header of every signed-in answer (at once with the latest
 * known value). Returns the unsubscribe function.
 */
export function onSessionExpiry(listener: SessionListener): () => void {
  sessionListeners.add(listener);
  if (lastSessionExpiry !== undefined) listener(lastSessionExpiry);
  return () => sessionListeners.delete(listener);
}

type UnauthorizedListener = (url: string) => void;
const unauthorizedListeners = new Set<UnauthorizedListener>();

/** Forgets the CSRF token and the session's end: call after sign-in and sign-out (each starts a new session). */
export function resetSessionState() {
  csrfToken = undefined;
  lastSessionExpiry = undefined;
}

/** Calls `listener` when any request answers 401 (the session ended); returns the unsubscribe function. */
export function onUnauthorized(listener: UnauthorizedListener): () => void {
  unauthorizedListeners.add(listener);
  return () => unauthorizedListeners.delete(listener);
}

export interface RequestOptions<T extends z.ZodType> {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown;
  schema?: T;
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

async function send(url: string, method: string, options: RequestOptions<z.ZodType>): Promise<Response> {
  const headers: Record<string, string> = { Accept: "application/json", ...options.headers };
  if (options.body !== undefined) headers["Content-Type"] = "application/json";
  // The public calculators keep no session, so they need no token.
  if (method !== "GET" && !url.startsWith("/api/calc/"))
    headers["x-csrf-token"] = csrfToken ?? (await fetchCsrfToken());
  try {
    return await fetch(url, {
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
}

export async function api<T extends z.ZodType>(url: string, options: RequestOptions<T> = {}): Promise<z.output<T>> {
  const method = options.method ?? "GET";
  let res = await send(url, method, options);
  let text = await res.text();
  let json: unknown = text ? safeJson(text) : undefined;
  if (res.status === 403 && (json as { error?: { code?: string } } | undefined)?.error?.code === "csrf_invalid") {
    // The session changed under us (expired, or signed in elsewhere): get its token and try once more.
    csrfToken = undefined;
    res = await send(url, method, options);
    text = await res.text();
    json = text ? safeJson(text) : undefined;
  }
  const expiresIn = res.headers.get("x-session-expires-in");
  if (expiresIn !== null && Number.isFinite(Number(expiresIn))) {
    lastSessionExpiry = Date.now() + Number(expiresIn) * 1000;
    for (const listener of sessionListeners) listener(lastSessionExpiry);
  }
  if (res.status === 401) for (const listener of unauthorizedListeners) listener(url);
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
