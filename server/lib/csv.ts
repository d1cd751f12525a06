/**
 * CSV exports: the writer lives in shared/csv.ts (the client's table export uses the same one);
 * this adds the HTTP answer with a download file name.
 */
export { csvCell, neutraliseCsvText, toCsv, type CsvColumn, type CsvValue } from "../../shared/csv";

/** A CSV download: `text/csv; charset=utf-8` with an attachment file name (letters, digits, dot, dash only). */
export function csvDownload(
  fileName: string,
  csv: string,
): { raw: string; type: string; headers: Record<string, string> } {
  const safeName = fileName.replace(/[^A-Za-z0-9._-]+/g, "-");
  return {
    raw: csv,
    type: "text/csv; charset=utf-8",
    headers: { "Content-Disposition": `attachment; filename="${safeName}"` },
  };
}
