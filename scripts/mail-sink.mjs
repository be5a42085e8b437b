#!/usr/bin/env node
/**
 * Local SMTP sink: accepts every message on SMTP_PORT and keeps it in memory; an HTTP inbox on
 * INBOX_PORT lists them (GET /messages, newest last) and clears them (DELETE /messages). Each
 * message keeps its plain text and its attachments (file name, type, size, bytes in base64).
 */
import http from "node:http";

import { SMTPServer } from "smtp-server";

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const inboxPort = Number(process.env.INBOX_PORT ?? 2526);
const messages = [];

function headersOf(head) {
  const headers = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, " ").split(/\r?\n/)) {
    const i = line.indexOf(":");
    if (i > 0) headers[line.slice(0, i).trim().toLowerCase()] = line.slice(i + 1).trim();
  }
  return headers;
}

/** A header's parameter (`boundary`, `filename`), quoted or not. */
const param = (value, name) =>
  new RegExp(`${name}\\*?=(?:"([^"]*)"|([^;\\s]+))`, "i")
    .exec(value ?? "")
    ?.slice(1)
    .find(Boolean);

function decode(body, encoding) {
  if (/base64/i.test(encoding ?? "")) return Buffer.from(body.replace(/\s+/g, ""), "base64");
  if (/quoted-printable/i.test(encoding ?? ""))
    return Buffer.from(
      body
        .replace(/=\r?\n/g, "")
        .replace(/=([0-9A-F]{2})/gi, (_, h) => String.fromCharCode(parseInt(h, 16))),
      "latin1",
    );
  return Buffer.from(body, "utf8");
}

/**
 * One MIME entity: its headers, and either its text or, for multipart, its parts in turn. The
 * message's text is its first text/plain part; every part with a file name is an attachment,
 * kept with its bytes (base64) so tests can open it.
 */
function parse(raw, out = { text: "", attachments: [] }) {
  const cut = raw.search(/\r?\n\r?\n/);
  const head = cut < 0 ? raw : raw.slice(0, cut);
  const body = cut < 0 ? "" : raw.slice(cut).replace(/^\r?\n\r?\n/, "");
  const headers = headersOf(head);
  const type = headers["content-type"] ?? "text/plain";
  const boundary = /^multipart\//i.test(type) ? param(type, "boundary") : null;
  if (boundary) {
    const parts = body.split(`--${boundary}`).slice(1);
    for (const part of parts) {
      if (part.startsWith("--")) break;
      parse(part.replace(/^\r?\n/, ""), out);
    }
  } else {
    const filename =
      param(headers["content-disposition"], "filename") ?? param(type, "name") ?? null;
    const bytes = decode(body, headers["content-transfer-encoding"]);
    if (filename)
      out.attachments.push({
        filename,
        contentType: type.split(";")[0].trim(),
        size: bytes.length,
        contentBase64: bytes.toString("base64"),
      });
    else if (!out.text && /^text\/plain/i.test(type))
      out.text = bytes.toString("utf8").replace(/\r\n/g, "\n");
  }
  return { headers, ...out };
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  onData(stream, session, done) {
    const chunks = [];
    stream.on("data", (c) => chunks.push(c));
    stream.on("end", () => {
      const { headers, text, attachments } = parse(Buffer.concat(chunks).toString("utf8"));
      messages.push({
        id: messages.length + 1,
        from: session.envelope.mailFrom?.address,
        to: session.envelope.rcptTo.map((r) => r.address),
        subject: headers.subject ?? "",
        text,
        attachments,
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
