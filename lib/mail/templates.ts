import { env } from "@/lib/env";
import type { MailMessage } from "@/lib/mail/transport";

/** Absolute links in e-mails point at the app's public origin. */
export function appUrl(path: string): string {
  const base = env.NEXTAUTH_URL.replace(/\/+$/, "");
  return `${base}${path}`;
}

function formatHz(hz: number): string {
  const units: [number, string][] = [
    [1e9, "GHz"],
    [1e6, "MHz"],
    [1e3, "kHz"],
  ];
  for (const [scale, unit] of units)
    if (Math.abs(hz) >= scale) return `${Number((hz / scale).toPrecision(5))} ${unit}`;
  return `${Number(hz.toPrecision(5))} Hz`;
}

function quote(body: string): string {
  return body
    .split("\n")
    .map((l) => `> ${l}`)
    .join("\n");
}

export function commentMail(p: {
  to: string;
  commenter: string;
  runTitle: string;
  runId: string;
  body: string;
  frequencyHz?: number | null;
  trace?: string | null;
  isReply: boolean;
}): MailMessage {
  const pin = p.frequencyHz != null ? ` at ${formatHz(p.frequencyHz)}${p.trace ? ` on ${p.trace}` : ""}` : "";
  return {
    to: p.to,
    subject: `${p.commenter} ${p.isReply ? "replied" : "commented"} on "${p.runTitle}"`,
    text: `${p.commenter} ${p.isReply ? "replied in a thread" : "left a comment"}${pin} on the run "${p.runTitle}":\n\n${quote(p.body)}\n\nOpen the run: ${appUrl(`/runs/${p.runId}`)}\n`,
  };
}

/** The run's bench readings beside its prediction, one line each (lib/readings.ts `readingSummaryLines`). */
function benchSection(lines?: string[]): string {
  if (!lines?.length) return "";
  return `\n\nBench readings (${lines.length}):\n${lines.map((l) => `- ${l}`).join("\n")}`;
}

/** To each reviewer of the team when a designer asks for sign-off. */
export function signOffRequestMail(p: {
  to: string;
  requester: string;
  runTitle: string;
  runId: string;
  note?: string | null;
  readings?: string[];
}): MailMessage {
  return {
    to: p.to,
    subject: `Sign-off asked: "${p.runTitle}"`,
    text: `${p.requester} asks you to sign off the run "${p.runTitle}", or send it back with a note.${p.note ? `\n\n${quote(p.note)}` : ""}${benchSection(p.readings)}\n\nOpen the run: ${appUrl(`/runs/${p.runId}`)}\n`,
  };
}

/** To the run's author when a reviewer signs the run off or sends it back. */
export function verdictMail(p: {
  to: string;
  reviewer: string;
  runTitle: string;
  runId: string;
  verdict: "sign_off" | "send_back";
  note?: string | null;
  readings?: string[];
}): MailMessage {
  const signedOff = p.verdict === "sign_off";
  return {
    to: p.to,
    subject: `${signedOff ? "Signed off" : "Sent back"}: "${p.runTitle}"`,
    text: `${p.reviewer} ${signedOff ? "signed off" : "sent back"} your run "${p.runTitle}".${p.note ? `\n\n${quote(p.note)}` : ""}${benchSection(p.readings)}\n\nOpen the run: ${appUrl(`/runs/${p.runId}`)}\n`,
  };
}

export function invitationMail(p: {
  to: string;
  inviter: string;
  teamName: string;
  role: string;
  token: string;
  expiresAt: Date;
}): MailMessage {
  return {
    to: p.to,
    subject: `${p.inviter} invited you to ${p.teamName} on Phasewright`,
    text: `${p.inviter} invited you to join the team "${p.teamName}" as ${p.role}.\n\nAccept the invitation: ${appUrl(`/invite/${p.token}`)}\n\nThe link works once and expires on ${p.expiresAt.toUTCString()}.\n`,
  };
}

/** Sent at sign-up (and on request): the link proves the person signing up reads this address. */
export function verificationMail(p: { to: string; name: string; token: string }): MailMessage {
  return {
    to: p.to,
    subject: "Confirm your e-mail address for Phasewright",
    text: `Hello ${p.name},\n\nConfirm that this address is yours: ${appUrl(`/verify/${p.token}`)}\n\nThe link works once, for two days. Until then you can work in your own workbench, but not join a team by invitation. If you did not create an account, ignore this message.\n`,
  };
}

export function passwordResetMail(p: { to: string; name: string; token: string }): MailMessage {
  return {
    to: p.to,
    subject: "Choose a new Phasewright password",
    text: `Hello ${p.name},\n\nSomeone (we hope you) asked to reset the password of this Phasewright account. Choose a new one here: ${appUrl(`/reset/${p.token}`)}\n\nThe link works once, for one hour, and signs you out everywhere else. If you did not ask for it, ignore this message: your password stays as it is.\n`,
  };
}
