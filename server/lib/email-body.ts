/**
 * Bodies of the app's e-mails: plain text first (read everywhere, screen-reader friendly) and a
 * simple HTML part with the same paragraphs, escaped.
 */

export function escapeHtml(text: string): string {
  return text.replace(
    /[&<>"']/g,
    (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c,
  );
}

/** Paragraphs as HTML; the link, when given, goes right after paragraph `linkAfter`. */
export function htmlBody(paragraphs: string[], link?: { href: string; label: string; linkAfter: number }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`);
  if (link)
    body.splice(link.linkAfter + 1, 0, `<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>`);
  return `<!doctype html><html lang="en"><body style="font-family:sans-serif;font-size:18px;line-height:1.5">${body.join("")}</body></html>`;
}

/** Paragraphs as plain text, one blank line apart. */
export const plainBody = (paragraphs: string[]) => `${paragraphs.join("\n\n")}\n`;
