import nodemailer, { type Transporter } from "nodemailer";

import { serverEnv } from "@/lib/env";

let transport: Transporter | undefined;

/** Sends one e-mail through SMTP_URL (the local mail sink by default). */
export async function sendMail(msg: {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Files sent with the message (a quote PDF, a spec sheet). */
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}): Promise<{ messageId: string | null }> {
  const env = serverEnv();
  transport ??= nodemailer.createTransport(
    `${env.SMTP_URL}${env.SMTP_URL.includes("?") ? "&" : "?"}connectionTimeout=5000&greetingTimeout=5000&socketTimeout=10000`,
  );
  const info = await transport.sendMail({ from: env.MAIL_FROM, ...msg });
  return { messageId: typeof info.messageId === "string" ? info.messageId : null };
}
