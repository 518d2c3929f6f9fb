import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "@/lib/env";

const globalForMail = globalThis as unknown as { kaliboreMail?: Transporter };

/** SMTP transport: the local capture fake by default, any real server through SMTP_*. */
export const mailer: Transporter =
  globalForMail.kaliboreMail ??
  nodemailer.createTransport({
    host: serverEnv.SMTP_HOST,
    port: serverEnv.SMTP_PORT,
    secure: serverEnv.SMTP_SECURE,
    ignoreTLS: !serverEnv.SMTP_SECURE && serverEnv.SMTP_HOST === "127.0.0.1",
    auth: serverEnv.SMTP_USER ? { user: serverEnv.SMTP_USER, pass: serverEnv.SMTP_PASSWORD ?? "" } : undefined,
  });
globalForMail.kaliboreMail = mailer;

export type MailMessage = { to: string; subject: string; text: string; html: string };

export async function sendMail(message: MailMessage): Promise<void> {
  await mailer.sendMail({ from: serverEnv.MAIL_FROM, ...message });
}
