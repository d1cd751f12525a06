import { htmlBody as html, plainBody as plain } from "../../lib/email-body";
import type { OutgoingEmail } from "../outbox/outbox.service";

/** A household was moved to another digester by a coordinator. */
export function newDigesterEmail(input: {
  to: string;
  name: string;
  householdName: string;
  digesterName: string;
  siteDescription: string;
  distanceM: number | null;
  previousDigesterName: string | null;
  why: string;
}): OutgoingEmail {
  const walk = input.distanceM === null ? "" : ` It is about ${Math.round(input.distanceM)} m from your home.`;
  const lines = [
    `Hello ${input.name},`,
    `From now on, please bring ${input.householdName}'s food scraps to the ${input.digesterName} digester${input.siteDescription ? ` (${input.siteDescription})` : ""}${input.previousDigesterName ? ` instead of ${input.previousDigesterName}` : ""}.${walk}`,
    `Why: ${input.why}`,
    "Your drop-off page shows the new digester and how much it welcomes today. Thank you for feeding it.",
  ];
  return { to: input.to, subject: `Your digester is now ${input.digesterName}`, text: plain(lines), html: html(lines) };
}

/** A pending drop-off was moved to another digester today. */
export function dropOffMovedEmail(input: {
  to: string;
  name: string;
  forDate: string;
  fromName: string;
  toName: string;
  why: string;
}): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    `Your drop-off for ${input.forDate} now goes to the ${input.toName} digester instead of ${input.fromName}.`,
    `Why: ${input.why}`,
    "Nothing else changes: bring the same buckets to the new place.",
  ];
  return {
    to: input.to,
    subject: `Please bring your scraps to ${input.toName} on ${input.forDate}`,
    text: plain(lines),
    html: html(lines),
  };
}
