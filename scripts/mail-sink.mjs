#!/usr/bin/env node
/**
 * Local SMTP sink: accepts every message on SMTP_PORT and keeps it in memory; an HTTP inbox on
 * INBOX_PORT lists them (GET /messages, newest last) and clears them (DELETE /messages).
 */
import http from "node:http";

import { SMTPServer } from "smtp-server";

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const inboxPort = Number(process.env.INBOX_PORT ?? 2526);
const messages = [];

function parse(raw) {
  const [head, ...rest] = raw.split(/\r?\n\r?\n/);
  const headers = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, " ").split(/\r?\n/)) {
    const i = line.indexOf(":");
    if (i > 0) headers[line.slice(0, i).trim().toLowerCase()] = line.slice(i + 1).trim();
  }
  let text = rest.join("\n\n");
  if (/quoted-printable/i.test(headers["content-transfer-encoding"] ?? "")) {
    text = text
      .replace(/=\r?\n/g, "")
      .replace(/=([0-9A-F]{2})/gi, (_, h) => String.fromCharCode(parseInt(h, 16)));
    text = Buffer.from(text, "latin1").toString("utf8");
  }
  return { headers, text };
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  onData(stream, session, done) {
    const chunks = [];
    stream.on("data", (c) => chunks.push(c));
    stream.on("end", () => {
      const { headers, text } = parse(Buffer.concat(chunks).toString("utf8"));
      messages.push({
        id: messages.length + 1,
        from: session.envelope.mailFrom?.address,
        to: session.envelope.rcptTo.map((r) => r.address),
        subject: headers.subject ?? "",
        text,
        receivedAt: new Date().toISOString(),
      });
      done();
    });
  },
});

const inbox = http.createServer((req, res) => {
  if (req.url?.startsWith("/messages")) {
    if (req.method === "DELETE") messages.length = 0;
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify(messages));
    return;
  }
  res.writeHead(404).end();
});

smtp.on("error", (e) => {
  console.error(`mail sink: ${e.message}`);
  process.exit(1);
});
inbox.on("error", (e) => {
  console.error(`mail sink inbox: ${e.message}`);
  process.exit(1);
});
smtp.listen(smtpPort, "127.0.0.1", () =>
  inbox.listen(inboxPort, "127.0.0.1", () =>
    console.log(
      `mail sink: SMTP 127.0.0.1:${smtpPort}, inbox http://127.0.0.1:${inboxPort}/messages`,
    ),
  ),
);
for (const sig of ["SIGINT", "SIGTERM"])
  process.on(sig, () => {
    smtp.close();
    inbox.close();
    process.exit(0);
  });
