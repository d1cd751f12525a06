import { useEffect, useRef, useState } from "react";
import { Button, Dialog } from "@/components/ui";
import { onSessionExpiry } from "@/lib/api-client";
import { useStaySignedIn } from "../api/stay-signed-in";

/** The warning opens this long before the session ends (WCAG 2.2.1: at least 20 seconds to respond). */
export const WARNING_BEFORE_MS = 2 * 60_000;

function minutesAndSeconds(ms: number): string {
  const total = Math.max(0, Math.round(ms / 1000));
  const minutes = Math.floor(total / 60);
  const seconds = total % 60;
  if (minutes === 0) return `${seconds} second${seconds === 1 ? "" : "s"}`;
  return `${minutes} minute${minutes === 1 ? "" : "s"}${seconds ? ` ${seconds} second${seconds === 1 ? "" : "s"}` : ""}`;
}

/**
 * Two minutes before the signed-in session ends (30 minutes idle, or 8 hours after sign-in), a
 * dialog offers one button to stay signed in (WCAG 2.2.1 Timing Adjustable). When the 8-hour
 * limit is the one that ends it, staying is not possible and the dialog says so.
 */
export function SessionExpiryWarning({ onExpired, onSignOut }: { onExpired: () => void; onSignOut: () => void }) {
  const [expiresAt, setExpiresAt] = useState<number | null>(null);
  const [now, setNow] = useState(() => Date.now());
  const [dismissedFor, setDismissedFor] = useState<number | null>(null);
  const stay = useStaySignedIn();
  const stayButton = useRef<HTMLButtonElement>(null);

  useEffect(() => onSessionExpiry(setExpiresAt), []);

  // Tick once a second only while the warning could be showing; otherwise wake up when it should.
  useEffect(() => {
    if (expiresAt === null) return;
    const left = expiresAt - Date.now();
    if (left <= 0) {
      onExpired();
      return;
    }
    const delay = left > WARNING_BEFORE_MS ? left - WARNING_BEFORE_MS : 1_000;
    const timer = window.setTimeout(() => setNow(Date.now()), Math.min(delay, 2_147_000_000));
    return () => window.clearTimeout(timer);
  }, [expiresAt, now, onExpired]);

  const left = expiresAt === null ? Infinity : expiresAt - now;
  const open = left <= WARNING_BEFORE_MS && left > 0 && dismissedFor !== expiresAt;
  // After "stay signed in" the end did not move far: the 8-hour limit is what ends this session.
  const cannotExtend = stay.isSuccess && stay.data.expiresInSeconds * 1000 <= WARNING_BEFORE_MS;

  // The dialog focuses its first control (the close button); the action people want is staying.
  // This parent effect runs after the dialog's own, so it has the last word.
  useEffect(() => {
    if (open) stayButton.current?.focus();
  }, [open]);

  return (
    <Dialog
      open={open}
      onClose={() => setDismissedFor(expiresAt)}
      title="Your session is about to end"
      description={
        cannotExtend
          ? `You have been signed in for almost 8 hours, the longest a session lasts. You will be signed out in ${minutesAndSeconds(left)}; save your work and sign in again.`
          : `For your security you will be signed out in ${minutesAndSeconds(left)} unless you choose to stay.`
      }
      footer={
        <>
          <Button type="button" variant="outline" onClick={onSignOut}>
            Sign out now
          </Button>
          {cannotExtend ? null : (
            <Button ref={stayButton} type="button" loading={stay.isPending} onClick={() => stay.mutate()}>
              Stay signed in
            </Button>
          )}
        </>
      }
    >
      {stay.isError ? (
        <p className="font-bold text-danger">Could not reach Hearthloop to keep you signed in. Try again.</p>
      ) : null}
    </Dialog>
  );
}
