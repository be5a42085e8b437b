const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:2536/messages";

export interface MailAttachment {
  filename: string;
  contentType: string;
  size: number;
  /** The file's bytes, base64. */
  contentBase64: string;
}

export interface Mail {
  to: string[];
  subject: string;
  text: string;
  /** Files sent with the message, bytes kept by the sink (scripts/mail-sink.mjs). */
  attachments: MailAttachment[];
}

/** Waits for a message to `to` whose subject matches; returns it. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15000): Promise<Mail> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    const all = (await (await fetch(INBOX)).json()) as Mail[];
    const hit = all.reverse().find((m) => m.to.includes(to) && subject.test(m.subject));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} matching ${subject}`);
}

/** An attachment's bytes, by file name pattern; throws naming what the message carries. */
export function attachment(mail: Mail, name: RegExp): Buffer {
  const a = mail.attachments.find((x) => name.test(x.filename));
  if (!a)
    throw new Error(
      `no attachment matching ${name} in: ${mail.attachments.map((x) => x.filename).join(", ") || "none"}`,
    );
  return Buffer.from(a.contentBase64, "base64");
}

export const firstLink = (text: string): string => {
  const m = text.match(/https?:\/\/\S+/);
  if (!m) throw new Error(`no link in: ${text}`);
  return m[0];
};
