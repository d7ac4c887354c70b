import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

export type MailMessage = { to: string; subject: string; text: string; html?: string | null };
/** Sends one message or throws; the outbox treats a throw as "try again later". */
export type MailSender = (message: MailMessage) => Promise<void>;

const LOOPBACK = new Set(["127.0.0.1", "localhost", "::1", "[::1]"]);
const transports = new Map<string, Transporter>();

function transportFor(url: string): Transporter {
  let t = transports.get(url);
  if (!t) {
    // Short timeouts: a dead mail server must not hold a request or the pump for long.
    const u = new URL(url);
    const secure = u.protocol === "smtps:";
    t = nodemailer.createTransport({
      host: u.hostname,
      port: Number(u.port || (secure ? 465 : 587)),
      secure,
      // The local sink on loopback has no certificate worth checking; a hosted server keeps TLS checks.
      ...(LOOPBACK.has(u.hostname) ? { ignoreTLS: true } : {}),
      ...(u.username
        ? { auth: { user: decodeURIComponent(u.username), pass: decodeURIComponent(u.password) } }
        : {}),
      // Short timeouts: a dead mail server must not hold a request or the pump for long.
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 10_000,
    });
    transports.set(url, t);
  }
  return t;
}

/** A sender over SMTP (SMTP_URL, default the local sink on 127.0.0.1:2526). */
export function smtpSender(url = env.SMTP_URL): MailSender {
  const from = env.MAIL_FROM;
  return async (m) => {
    await transportFor(url).sendMail({
      from,
      to: m.to,
      subject: m.subject,
      text: m.text,
      ...(m.html ? { html: m.html } : {}),
    });
  };
}
