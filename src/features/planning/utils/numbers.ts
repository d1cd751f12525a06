/**
 * Reading and writing numbers in the planning forms. Input stays text until submit so a half-typed
 * value is never rewritten under the cursor; the shared zod schemas then judge it.
 */

const decimal = /^[-+]?(\d+(\.\d*)?|\.\d+)(e[-+]?\d+)?$/i;

/**
 * Text of a number field → a number, `undefined` when empty, or the text itself when it is not a
 * number (so the schema answers with its "must be a number from … to …" message). A single comma
 * is read as the decimal point, as many keyboards offer it.
 */
export function readNumber(raw: string): number | string | undefined {
  const text = raw.trim().replace(/\s/g, "");
  if (text === "") return undefined;
  const normalised = /^[^,]*,[^,]*$/.test(text) && !text.includes(".") ? text.replace(",", ".") : text;
  return decimal.test(normalised) ? Number(normalised) : raw;
}

/** Body of a calculator request from field texts: empty fields are left out, so the server's defaults apply. */
export function readNumbers(values: Record<string, string>): Record<string, number | string> {
  const body: Record<string, number | string> = {};
  for (const [name, raw] of Object.entries(values)) {
    const value = readNumber(raw);
    if (value !== undefined) body[name] = value;
  }
  return body;
}

const formats = new Map<number, Intl.NumberFormat>();

/** A figure for reading: thousands separators and at most `fractionDigits` decimals. */
export function formatNumber(value: number, fractionDigits = 1): string {
  let format = formats.get(fractionDigits);
  if (!format) {
    format = new Intl.NumberFormat("en-GB", { maximumFractionDigits: fractionDigits });
    formats.set(fractionDigits, format);
  }
  // "-0" reads as a mistake.
  return format.format(Object.is(value, -0) ? 0 : value);
}
