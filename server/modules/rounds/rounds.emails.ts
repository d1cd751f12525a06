/** E-mails about collection rounds: the day-before reminders to the volunteer and to each household. */
import { htmlBody, plainBody } from "../../lib/email-body";
import type { OutgoingEmail } from "../outbox/outbox.service";

const buckets = (n: number) => `${n} bucket${n === 1 ? "" : "s"}`;

/** To the volunteer: tomorrow's round, with the link to its sheet. */
export function roundReminderEmail(input: {
  to: string;
  name: string;
  roundId: number;
  forDate: string;
  stopCount: number;
  bucketCount: number;
  endDigesterName: string;
  link: string;
}): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    `Tomorrow, ${input.forDate}, you have a collection round: ${input.stopCount} stop${input.stopCount === 1 ? "" : "s"}, ${buckets(input.bucketCount)} in all, ending at the ${input.endDigesterName} digester.`,
    "The round sheet has the stops in order with their addresses, a map and a printable page; mark each stop collected as you go.",
    "Hand the buckets to the digester's steward, who weighs them in against the day's feed budget. Thank you for riding.",
  ];
  return {
    to: input.to,
    subject: `Your collection round tomorrow (${input.forDate})`,
    text: `${plainBody(lines.slice(0, 3))}${input.link}\n\n${lines[3]}\n`,
    html: htmlBody(lines, { href: input.link, label: "Open the round sheet", linkAfter: 2 }),
    dedupeKey: `round-reminder:${input.roundId}:${input.to}`,
  };
}

/** To each active resident of a household on the round: the buckets will be collected tomorrow. */
export function collectionReminderEmail(input: {
  to: string;
  name: string;
  roundId: number;
  householdName: string;
  forDate: string;
  bucketCount: number;
  link: string;
}): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    `A volunteer with a cargo bike collects ${input.householdName}'s ${buckets(input.bucketCount)} of sorted food scraps tomorrow, ${input.forDate}.`,
    "Please have the buckets closed and ready at your door in the morning. If you no longer need the collection, cancel it on your household page:",
    "Thank you for keeping your scraps out of the bin.",
  ];
  return {
    to: input.to,
    subject: `Your food scraps are collected tomorrow (${input.forDate})`,
    text: `${plainBody(lines.slice(0, 3))}${input.link}\n\n${lines[3]}\n`,
    html: htmlBody(lines, { href: input.link, label: "Your household page", linkAfter: 2 }),
    dedupeKey: `collection-reminder:${input.roundId}:${input.to}`,
  };
}
