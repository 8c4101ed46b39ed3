import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

// SMTP settings come from lib/env.ts: the local fake in the demo and tests, a real
// provider in production, by configuration alone.
let transporter: Transporter | undefined;

function transport(): Transporter {
  if (!transporter) {
    const e = env();
    transporter = nodemailer.createTransport({
      host: e.SMTP_HOST,
      port: e.SMTP_PORT,
      secure: e.SMTP_SECURE,
      ignoreTLS: !e.SMTP_SECURE && ["127.0.0.1", "localhost"].includes(e.SMTP_HOST),
      auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? "" } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 20_000,
    });
  }
  return transporter;
}

export type Mail = { to: string; subject: string; text: string; html?: string };

export async function sendMail(mail: Mail): Promise<void> {
  await transport().sendMail({ from: env().MAIL_FROM, ...mail });
}
