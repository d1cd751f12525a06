/**
 * Account e-mails: plain text first (read everywhere, screen-reader friendly), with a simple
 * HTML part. Links carry one-time tokens; the e-mail never contains a password.
 */
import { htmlBody as html } from "../../lib/email-body";
import type { OutgoingEmail } from "./outbox.service";

function formatWhen(date: Date): string {
  return date.toUTCString().replace("GMT", "UTC");
}

export function invitationEmail(input: {
  to: string;
  name: string;
  inviterName: string;
  link: string;
  expiresAt: Date;
}): OutgoingEmail {
  const greeting = input.name ? `Hello ${input.name},` : "Hello,";
  const lines = [
    greeting,
    `${input.inviterName} has invited you to Hearthloop, the board your neighbourhood uses to feed its food scraps to the shared biogas digesters.`,
    `To accept, open this link and choose a password. The link works once and until ${formatWhen(input.expiresAt)}.`,
    "If you did not expect this, you can ignore this e-mail.",
  ];
  return {
    to: input.to,
    subject: "You are invited to Hearthloop",
    text: `${lines[0]}\n\n${lines[1]}\n\n${lines[2]}\n${input.link}\n\n${lines[3]}\n`,
    html: html(lines, { href: input.link, label: "Accept the invitation", linkAfter: 2 }),
  };
}

export function passwordResetEmail(input: { to: string; name: string; link: string; expiresAt: Date }): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    `Someone asked to reset the password of your Hearthloop account. To choose a new password, open this link. It works once and until ${formatWhen(input.expiresAt)}.`,
    "If it was not you, ignore this e-mail: your password stays as it is.",
  ];
  return {
    to: input.to,
    subject: "Reset your Hearthloop password",
    text: `${lines[0]}\n\n${lines[1]}\n${input.link}\n\n${lines[2]}\n`,
    html: html(lines, { href: input.link, label: "Choose a new password", linkAfter: 1 }),
  };
}

export function emailChangedEmail(input: { to: string; name: string; newEmail: string }): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    `The e-mail address of your Hearthloop account was changed to ${input.newEmail}. Sign-in and notifications now use the new address.`,
    "If you did not do this, ask your neighbourhood's coordinator to disable the account at once.",
  ];
  return {
    to: input.to,
    subject: "Your Hearthloop e-mail address was changed",
    text: lines.join("\n\n") + "\n",
    html: html(lines),
  };
}

export function passwordChangedEmail(input: { to: string; name: string }): OutgoingEmail {
  const lines = [
    `Hello ${input.name},`,
    "The password of your Hearthloop account was just changed, and every other signed-in device was signed out.",
    "If you did not do this, reset your password from the sign-in page or ask your coordinator for help.",
  ];
  return {
    to: input.to,
    subject: "Your Hearthloop password was changed",
    text: lines.join("\n\n") + "\n",
    html: html(lines),
  };
}
