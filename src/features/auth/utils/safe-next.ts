/**
 * Where to go after signing in: only a path on this site. Absolute URLs, protocol-relative
 * `//host`, backslash tricks and anything that resolves to another origin are ignored (an open
 * redirect would let a phishing link land people on a look-alike site after a real sign-in).
 */
export function safeNext(next: string | null | undefined, origin: string = window.location.origin): string | null {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.includes("\\")) return null;
  try {
    const url = new URL(next, origin);
    if (url.origin !== origin) return null;
    return url.pathname + url.search + url.hash;
  } catch {
    return null;
  }
}
