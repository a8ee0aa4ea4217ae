import "server-only";
import nodemailer, { type Transporter } from "nodemailer";

export type MailMessage = { to: string; subject: string; text: string; html?: string };

export function smtpSettings() {
  return {
    host: process.env.SMTP_HOST ?? "127.0.0.1",
    port: Number(process.env.SMTP_PORT ?? 2525),
    secure: process.env.SMTP_SECURE === "true",
    // The local catcher speaks plain SMTP on loopback; a real relay sets SMTP_SECURE or STARTTLS.
    ignoreTLS: process.env.SMTP_SECURE !== "true" && (process.env.SMTP_HOST ?? "127.0.0.1") === "127.0.0.1",
    auth: { user: process.env.SMTP_USER ?? "lodebook", pass: process.env.SMTP_PASSWORD ?? "lodebook" },
  };
}

export const mailFrom = () => process.env.MAIL_FROM ?? "Lodebook <lodebook@localhost>";

let transport: Transporter | undefined;

export async function sendMail(message: MailMessage): Promise<void> {
  transport ??= nodemailer.createTransport(smtpSettings());
  await transport.sendMail({ from: mailFrom(), ...message });
}
