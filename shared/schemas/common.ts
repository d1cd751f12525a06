/**
 * Building blocks every contract uses for days, date-times and text, so that each rule is
 * written once: the days the app takes (2000-01-01 … 2100-12-31, so nothing outside reaches
 * the database or the day arithmetic), and which control characters a text field may hold.
 */
import { z } from "zod";

/** First and last day any request may name (inclusive). */
export const FIRST_DAY = "2000-01-01";
export const LAST_DAY = "2100-12-31";

const dayRangeMessage = `Give a day from ${FIRST_DAY} to ${LAST_DAY}.`;
const inDayRange = (isoDay: string) => isoDay >= FIRST_DAY && isoDay <= LAST_DAY;

/**
 * A calendar day as YYYY-MM-DD from 2000-01-01 to 2100-12-31. `label` starts the format message
 * ("Start date: give the day as YYYY-MM-DD.") where a form shows several days.
 */
export function isoDate(label?: string) {
  const format = label ? `${label}: give the day as YYYY-MM-DD.` : "Give the day as YYYY-MM-DD.";
  return z
    .string({ error: format })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: format, abort: true })
    .refine(
      (s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s),
      { error: "This is not a calendar day.", abort: true },
    )
    .refine(inDayRange, label ? `${label}: ${dayRangeMessage.toLowerCase()}` : dayRangeMessage);
}

/** The one day schema of the contracts (see {@link isoDate}). */
export const IsoDateSchema = isoDate();

const dateTimeFormat = "Give the time as an ISO 8601 date-time with its offset, e.g. 2026-05-03T08:30:00+01:00.";

/**
 * ISO 8601 date-time with a time-zone offset (Z or ±hh:mm), e.g. 2026-05-03T08:30:00+01:00, on a
 * day (as written) from 2000-01-01 to 2100-12-31.
 */
export const IsoDateTimeSchema = z.iso
  .datetime({ offset: true, error: dateTimeFormat })
  .refine((s) => inDayRange(s.slice(0, 10)), `Give a time on a day from ${FIRST_DAY} to ${LAST_DAY}.`);

/** A day (YYYY-MM-DD) or a date-time with its offset, each within the bounds: for range queries. */
export const IsoDateOrDateTimeSchema = z
  .string({ error: "Give a day as YYYY-MM-DD or a date-time with offset." })
  .superRefine((value, ctx) => {
    const schema = /^\d{4}-\d{2}-\d{2}$/.test(value) ? IsoDateSchema : IsoDateTimeSchema;
    const result = schema.safeParse(value);
    if (result.success) return;
    const message = result.error.issues[0]!.message;
    ctx.addIssue({
      code: "custom",
      message: message === dateTimeFormat ? "Give a day as YYYY-MM-DD or a date-time with offset." : message,
    });
  });

/**
 * Control characters (C0 U+0000–U+001F with TAB, LF and CR; DEL; C1 U+0080–U+009F) and the
 * Unicode line and paragraph separators (U+2028, U+2029). In a name they forge lines in
 * e-mails ("Bcc: …") and break table cells and CSV rows.
 */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const NOT_ONE_LINE = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/;
/** The same without TAB, LF and CR, which a note may hold. */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const NOT_NOTE_TEXT = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const ONE_LINE_MESSAGE = "Use one line of text: no line breaks, tabs or other control characters.";
export const NOTE_TEXT_MESSAGE = "Line breaks are fine here, but no other control characters.";

/**
 * A one-line text field (a name, a street, a digester's name: anything that is not a note).
 * Checked before trimming, so a name ending in CR LF is refused rather than quietly cut.
 * Chain `.trim()`, `.min()`, `.max()` as on any string.
 */
export function oneLineText(error: string) {
  return z.string({ error }).refine((s) => !NOT_ONE_LINE.test(s), { error: ONE_LINE_MESSAGE, abort: true });
}

/** A note or a reason typed in a text area: line breaks and tabs kept, other control characters refused. */
export function noteText(error: string) {
  return z.string({ error }).refine((s) => !NOT_NOTE_TEXT.test(s), { error: NOTE_TEXT_MESSAGE, abort: true });
}
