import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "../env";
import { logger } from "../log";

export type MailMessage = { to: string; subject: string; text: string; html?: string };

export function smtpSettings() {
  const env = serverEnv();
  return {
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    // The local catcher speaks plain SMTP on loopback; a real relay sets SMTP_SECURE or STARTTLS.
    ignoreTLS: !env.SMTP_SECURE && env.SMTP_HOST === "127.0.0.1",
    auth: { user: env.SMTP_USER, pass: env.SMTP_PASSWORD },
    // A relay that accepts and then says nothing must not hold a send for minutes.
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  };
}

export const mailFrom = () => serverEnv().MAIL_FROM;

let transport: { key: string; transporter: Transporter } | undefined;

export async function sendMail(message: MailMessage): Promise<void> {
  const settings = smtpSettings();
  const key = JSON.stringify(settings);
  if (transport?.key !== key) transport = { key, transporter: nodemailer.createTransport(settings) };
  await transport.transporter.sendMail({ from: mailFrom(), ...message });
}

const inFlight = new Set<Promise<void>>();

/**
 * Sends after the caller has answered: a sign-in e-mail's request is answered at once whether
 * or not the address belongs to a member (no timing difference to tell them apart), and a
 * silent relay holds nobody's request. A failure is logged; the member can ask again.
 */
export function sendMailLater(message: MailMessage, what: string): void {
  const sending = sendMail(message)
    .catch((error: Error) => logger.warn({ code: "mail_failed", what, reason: error.message }, "mail not sent"))
    .finally(() => inFlight.delete(sending));
  inFlight.add(sending);
}

/** Resolves once every mail handed to sendMailLater so far has been sent or has failed. */
export async function mailSettled(): Promise<void> {
  while (inFlight.size > 0) await Promise.all([...inFlight]);
}
