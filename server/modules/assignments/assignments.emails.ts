import { htmlBody as html, plainBody as plain } from "../../lib/email-body";
import type { OutgoingEmail } from "../outbox/outbox.service";

/**
 * Why a household was moved, as a code with its parameters (kg fresh scraps a week, metres):
 * the coordinator's own reason, the household's first digester, its digester closed, over its
 * safe weekly feed, a closer digester, or the general re-balancing.
 */
export type MoveReason =
  | { readonly code: "coordinatorReason"; readonly text: string }
  | { readonly code: "firstDigester"; readonly toName: string }
  | {
      readonly code: "digesterClosed";
      readonly fromName: string;
      readonly status: string;
      readonly statusReason: string | null;
    }
  | {
      readonly code: "digesterOverFull";
      readonly fromName: string;
      readonly expectedKg: number;
      readonly safeKg: number;
      readonly toName: string;
    }
  | { readonly code: "closer"; readonly toName: string; readonly fromName: string; readonly closerM: number }
  | { readonly code: "rebalanced" };

/** The reason a household moves, in the resident's words (the e-mail's "Why:" line). */
export function moveReasonWords(why: MoveReason): string {
  switch (why.code) {
    case "coordinatorReason":
      return why.text;
    case "firstDigester":
      return `your household had no digester yet, and ${why.toName} has room for your scraps.`;
    case "digesterClosed":
      return `${why.fromName} is ${why.status} for now${why.statusReason ? ` (${why.statusReason})` : ""}, so its households bring their scraps to other digesters.`;
    case "digesterOverFull":
      return `${why.fromName} was expecting about ${Math.round(why.expectedKg)} kg of scraps this week but can safely digest about ${Math.round(why.safeKg)} kg, and ${why.toName} has room.`;
    case "closer":
      return `${why.toName} is about ${Math.round(why.closerM)} m closer to your home than ${why.fromName}.`;
    case "rebalanced":
      return "the coordinator re-balanced households across the digesters so that each stays within its safe feed rate for the week while everyone walks as little as possible.";
  }
  return why satisfies never;
}

/** A household was moved to another digester by a coordinator. */
export function newDigesterEmail(input: {
  to: string;
  name: string;
  householdName: string;
  digesterName: string;
  siteDescription: string;
  distanceM: number | null;
  previousDigesterName: string | null;
  why: MoveReason;
}): OutgoingEmail {
  const walk = input.distanceM === null ? "" : ` It is about ${Math.round(input.distanceM)} m from your home.`;
  const lines = [
    `Hello ${input.name},`,
    `From now on, please bring ${input.householdName}'s food scraps to the ${input.digesterName} digester${input.siteDescription ? ` (${input.siteDescription})` : ""}${input.previousDigesterName ? ` instead of ${input.previousDigesterName}` : ""}.${walk}`,
    `Why: ${moveReasonWords(input.why)}`,
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
