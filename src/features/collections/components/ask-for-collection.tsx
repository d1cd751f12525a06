import { useState } from "react";
import { COLLECTION_REQUEST_STATUS_LABELS } from "@shared/schemas/collections";
import { Alert, Button, Card, CardContent, CardHeader, CardTitle, Field, Input } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useAskForCollection, useCancelCollection, useMyCollectionRequests } from "../api/requests";

function tomorrow(): string {
  const d = new Date(Date.now() + 86_400_000);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

/** "Ask for a collection": for residents who cannot carry their buckets; a volunteer's cargo bike comes by. */
export function AskForCollection() {
  const [forDate, setForDate] = useState(tomorrow());
  const [buckets, setBuckets] = useState("1");
  const ask = useAskForCollection();
  const cancel = useCancelCollection();
  const mine = useMyCollectionRequests();
  const fields = ask.error instanceof ApiError ? ask.error.fields : {};
  const live = (mine.data?.requests ?? []).filter((r) => r.status === "open" || r.status === "planned");

  return (
    <Card>
      <CardHeader>
        <CardTitle>Ask for a collection</CardTitle>
        <p className="text-base text-muted">
          Cannot carry your buckets? A volunteer with a cargo bike collects them and brings them to a digester.
        </p>
      </CardHeader>
      <CardContent className="flex flex-col gap-4">
        <form
          className="flex flex-wrap items-end gap-4"
          onSubmit={(e) => {
            e.preventDefault();
            ask.mutate({ forDate, bucketCount: Number(buckets) });
          }}
        >
          <Field label="Day" error={fields.forDate}>
            <Input type="date" value={forDate} onChange={(e) => setForDate(e.target.value)} required />
          </Field>
          <Field label="Buckets (10 litres each)" error={fields.bucketCount}>
            <Input
              type="number"
              min={1}
              max={20}
              step={1}
              value={buckets}
              onChange={(e) => setBuckets(e.target.value)}
              required
            />
          </Field>
          <Button type="submit" loading={ask.isPending}>
            Ask for a collection
          </Button>
        </form>
        {ask.isSuccess ? (
          <Alert variant="success" title="Asked">
            Your collection on {ask.data.forDate} is asked for. The coordinator plans the volunteers' rounds; you get an
            e-mail the day before when yours is on one.
          </Alert>
        ) : null}
        {ask.error && Object.keys(fields).length === 0 ? (
          <Alert variant="danger" title="Not asked">
            {ask.error.message}
          </Alert>
        ) : null}
        {live.length > 0 ? (
          <ul className="flex flex-col gap-2" aria-label="Your collections">
            {live.map((r) => (
              <li key={r.id} className="flex flex-wrap items-center gap-3">
                <span>
                  {r.forDate}: {r.bucketCount} bucket{r.bucketCount === 1 ? "" : "s"} —{" "}
                  {COLLECTION_REQUEST_STATUS_LABELS[r.status]}
                </span>
                <Button
                  type="button"
                  size="sm"
                  variant="outline"
                  onClick={() => cancel.mutate(r.id)}
                  disabled={cancel.isPending}
                >
                  Cancel<span className="sr-only"> the collection on {r.forDate}</span>
                </Button>
              </li>
            ))}
          </ul>
        ) : null}
        {cancel.error ? (
          <Alert variant="danger" title="Not cancelled">
            {cancel.error.message}
          </Alert>
        ) : null}
      </CardContent>
    </Card>
  );
}
