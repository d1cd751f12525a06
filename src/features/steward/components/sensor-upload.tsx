import { useId, useRef, useState, type FormEvent } from "react";
import { SENSOR_CSV_COLUMNS, SENSOR_CSV_MAX_ROWS, type ReadingImportResult } from "@shared/schemas/readings";
import { Alert, Button, Field, Progress, Table, TBody, TD, TH, THead, TR } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useUploadSensorLog, type UploadProgress } from "../api/upload-sensor-log";
import { formatDateTime, formatNumber } from "../utils/format";

const MAX_MB = 5;

const sizeText = (bytes: number) =>
  bytes < 1024
    ? `${bytes} bytes`
    : bytes < 1024 * 1024
      ? `${formatNumber(bytes / 1024, 0)} KB`
      : `${formatNumber(bytes / 1024 / 1024, 1)} MB`;

/** The sensor-log columns, as documented in the README. */
export function SensorCsvColumns({ captionId }: { captionId?: string }) {
  return (
    <Table label="Sensor log columns" aria-describedby={captionId}>
      <THead>
        <TR>
          <TH>Column</TH>
          <TH>Needed</TH>
          <TH>What it holds</TH>
        </TR>
      </THead>
      <TBody>
        {SENSOR_CSV_COLUMNS.map((c) => (
          <TR key={c.name}>
            <TD>
              <code>{c.name}</code>
            </TD>
            <TD>{c.required ? "Yes" : "Optional"}</TD>
            <TD>{c.description}</TD>
          </TR>
        ))}
      </TBody>
    </Table>
  );
}

export type SensorUploadProps = { digesterId: number; digesterName: string; onChanged?: () => void };

/** Upload a sensor log (CSV) with a progress bar, then a summary or the first problem with its line and column. */
export function SensorUpload({ digesterId, digesterName, onChanged }: SensorUploadProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const rulesId = useId();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [result, setResult] = useState<ReadingImportResult | null>(null);
  const [error, setError] = useState<{ title: string; message: string; field?: string } | null>(null);
  const upload = useUploadSensorLog(setProgress, onChanged);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setResult(null);
    setError(null);
    const file = inputRef.current?.files?.[0];
    if (!file) {
      setError({
        title: "Choose a file",
        message: "Choose the CSV file to upload.",
        field: "Choose the CSV file to upload.",
      });
      inputRef.current?.focus();
      return;
    }
    if (file.size > MAX_MB * 1024 * 1024) {
      const message = `The file is ${formatNumber(file.size / 1024 / 1024)} MB; the limit is ${MAX_MB} MB. Split it into smaller files.`;
      setError({ title: "The file is too large", message, field: message });
      inputRef.current?.focus();
      return;
    }
    setProgress({ loaded: 0, total: file.size });
    try {
      const answer = await upload.mutateAsync({ digesterId, file });
      setResult(answer);
      if (formRef.current) formRef.current.reset();
    } catch (err) {
      // The problem (with its line and column) sits under the field; the alert says what it means.
      const problem =
        err instanceof ApiError ? (err.fields.file ?? err.message) : "The upload failed. Please try again.";
      setError({
        title: "Nothing was imported",
        message: `Nothing from this file was written. ${problem} Fix it and upload the file again.`,
        field: problem,
      });
      inputRef.current?.focus();
    }
  };

  const sending = upload.isPending && progress !== null;
  const sentAll = progress !== null && progress.loaded >= progress.total;
  return (
    <div className="flex flex-col gap-4">
      <p id={rulesId}>
        A CSV file with commas between columns and a dot for decimals, no byte-order mark, up to {MAX_MB} MB and{" "}
        {formatNumber(SENSOR_CSV_MAX_ROWS, 0)} rows. The first line names the columns. The whole file is checked first:
        one bad line and nothing is imported, and you are told which line and column to fix. Rows already uploaded (same
        timestamp) are skipped, so uploading a file again is safe.
      </p>
      <SensorCsvColumns />
      <p className="text-base text-muted">
        Example: <code>timestamp,temperature_c,ph</code> then <code>2026-05-03T08:30:00+01:00,34.5,7.1</code>
      </p>
      <form
        ref={formRef}
        noValidate
        onSubmit={submit}
        aria-label={`Upload a sensor log for ${digesterName}`}
        className="flex flex-col gap-4"
      >
        <Field label="Sensor log (CSV)" hint={`Up to ${MAX_MB} MB.`} error={error?.field}>
          <input
            ref={inputRef}
            type="file"
            name="file"
            accept=".csv,text/csv"
            className="block w-full min-h-11 rounded-md border-2 border-border bg-surface p-2 text-lg file:mr-3 file:min-h-9 file:rounded-md file:border-0 file:bg-primary file:px-3 file:font-bold file:text-primary-foreground"
            onChange={() => {
              setError(null);
              setResult(null);
            }}
          />
        </Field>
        <div>
          <Button type="submit" loading={upload.isPending}>
            Upload and import
          </Button>
        </div>
      </form>
      {progress !== null && (sending || result || error) ? (
        <Progress
          label={sending ? (sentAll ? "Checking and importing" : "Uploading") : "Upload"}
          value={progress.loaded}
          max={progress.total || 1}
          valueText={`${formatNumber((progress.loaded / (progress.total || 1)) * 100, 0)}% of ${sizeText(progress.total)} sent${sending && sentAll ? ", checking the rows" : ""}`}
        />
      ) : null}
      {result ? (
        <Alert variant="success" title={`Imported ${formatNumber(result.imported, 0)} readings`}>
          <p>
            {formatNumber(result.rows, 0)} rows read
            {result.from && result.to
              ? `, from ${formatDateTime(result.from)} to ${formatDateTime(result.to)}`
              : ""}.{" "}
            {result.skippedDuplicates > 0
              ? `${formatNumber(result.skippedDuplicates, 0)} were already there (same timestamp) and were skipped.`
              : "None was there already."}
          </p>
        </Alert>
      ) : null}
      {error && error.title !== "Choose a file" ? (
        <Alert variant="danger" title={error.title} announce="assertive">
          <p>{error.message}</p>
        </Alert>
      ) : null}
    </div>
  );
}
