import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "@/lib/env";

let transport: Transporter | undefined;

/** Sends one e-mail through SMTP_URL (the local mail sink by default). */
export async function sendMail(msg: { to: string; subject: string; text: string; html?: string }): Promise<void> {
  const env = serverEnv();
  transport ??= nodemailer.createTransport(env.SMTP_URL);
  await transport.sendMail({ from: env.MAIL_FROM, ...msg });
}
