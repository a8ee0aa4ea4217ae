import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "../env";

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
