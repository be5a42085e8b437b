#!/usr/bin/env node
/**
 * Local stand-in for the card-payment provider's API, enough for the official SDK:
 *   POST /v1/checkout/sessions, GET /v1/checkout/sessions/:id   (Bearer key required)
 * a test checkout page at GET /pay/:id whose "Pay" button completes the session, sends a signed
 * `checkout.session.completed` webhook to WEBHOOK_URL and redirects to the session's success_url;
 * and, for tests: GET /__fake/events, POST /__fake/events/:id/deliver (send again),
 * POST /__fake/sessions/:id/complete (pay without the page), POST /__fake/sessions/:id/tamper
 * (a JSON body of fields the session then reports: amount_total, currency, payment_status, status,
 * metadata, client_reference_id — what a checkout made or changed behind the app's back would
 * say). State is in memory.
 * No real card is ever involved.
 */
import { createHmac, randomBytes } from "node:crypto";
import http from "node:http";

const port = Number(process.env.PAYMENTS_PORT ?? 12111);
const webhookUrl =
  process.env.PAYMENTS_WEBHOOK_URL ?? "http://127.0.0.1:3000/api/webhooks/payments";
// The app's webhook secret (scripts/start.sh and test-env.vars make one per checkout).
const secret = process.env.STRIPE_WEBHOOK_SECRET;
if (!secret) {
  console.error("payment fake: set STRIPE_WEBHOOK_SECRET to the app's webhook secret");
  process.exit(1);
}
const publicUrl = process.env.PAYMENTS_PUBLIC_URL ?? `http://127.0.0.1:${port}`;
const sessions = new Map();
const events = new Map();

const id = (prefix) => `${prefix}_test_${randomBytes(12).toString("hex")}`;
const now = () => Math.floor(Date.now() / 1000);

/** `a[b][0][c]=x` form bodies (the SDK's encoding) into nested objects and arrays. */
function parseForm(body) {
  const out = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.replace(/\]/g, "").split("[");
    let node = out;
    parts.forEach((p, i) => {
      if (i === parts.length - 1) node[p] = value;
      else node = node[p] ??= /^\d+$/.test(parts[i + 1]) ? [] : {};
    });
  }
  return out;
}

function send(res, status, body, headers = {}) {
  res.writeHead(status, { "content-type": "application/json", ...headers });
  res.end(JSON.stringify(body));
}
const apiError = (res, status, message, param) =>
  send(res, status, {
    error: { type: "invalid_request_error", message, ...(param ? { param } : {}) },
  });

function createSession(p) {
  const lines = Array.isArray(p.line_items) ? p.line_items : [];
  if (p.mode !== "payment") return [400, "mode must be payment", "mode"];
  if (!lines.length) return [400, "line_items is required", "line_items"];
  if (!p.success_url) return [400, "success_url is required", "success_url"];
  let amount = 0;
  let currency;
  for (const [i, l] of lines.entries()) {
    const unit = Number(l.price_data?.unit_amount);
    const qty = Number(l.quantity ?? 1);
    if (!Number.isInteger(unit) || unit < 0)
      return [
        400,
        "unit_amount must be a whole number of the smallest unit",
        `line_items[${i}][price_data][unit_amount]`,
      ];
    amount += unit * qty;
    currency = l.price_data?.currency;
  }
  const sid = id("cs");
  const s = {
    id: sid,
    object: "checkout.session",
    mode: "payment",
    status: "open",
    payment_status: "unpaid",
    amount_total: amount,
    amount_subtotal: amount,
    currency,
    livemode: false,
    created: now(),
    expires_at: now() + 86400,
    client_reference_id: p.client_reference_id ?? null,
    customer_email: p.customer_email ?? null,
    metadata: p.metadata ?? {},
    success_url: p.success_url.replace("{CHECKOUT_SESSION_ID}", sid),
    cancel_url: p.cancel_url ?? null,
    payment_intent: null,
    url: `${publicUrl}/pay/${sid}`,
    line_items_description: lines.map((l) => l.price_data?.product_data?.name ?? "Item").join(", "),
  };
  sessions.set(sid, s);
  return [200, s];
}

const TAMPERABLE = [
  "amount_total",
  "currency",
  "payment_status",
  "status",
  "metadata",
  "client_reference_id",
];

function publicSession(s) {
  const { line_items_description: _d, ...rest } = s;
  return rest;
}

async function deliver(evt) {
  const payload = JSON.stringify(evt);
  const t = now();
  const sig = createHmac("sha256", secret).update(`${t}.${payload}`).digest("hex");
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      const r = await fetch(webhookUrl, {
        method: "POST",
        headers: { "content-type": "application/json", "stripe-signature": `t=${t},v1=${sig}` },
        body: payload,
      });
      evt.deliveries.push({ at: new Date().toISOString(), status: r.status });
      if (r.ok) return r.status;
    } catch (e) {
      evt.deliveries.push({ at: new Date().toISOString(), error: String(e.message ?? e) });
    }
    await new Promise((r) => setTimeout(r, 300 * (attempt + 1)));
  }
  return 0;
}

function complete(s) {
  if (s.status === "open") {
    Object.assign(s, { status: "complete", payment_status: "paid", payment_intent: id("pi") });
  }
  const evt = {
    id: id("evt"),
    object: "event",
    type: "checkout.session.completed",
    api_version: "2026-01-01",
    created: now(),
    livemode: false,
    data: { object: publicSession(s) },
  };
  Object.defineProperty(evt, "deliveries", { value: [], enumerable: false });
  events.set(evt.id, evt);
  return evt;
}

const esc = (v) => String(v ?? "").replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
function checkoutPage(s) {
  const amount = `${(s.amount_total / 100).toFixed(2)} ${String(s.currency ?? "").toUpperCase()}`;
  const done = s.status !== "open";
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Test checkout</title>
<style>body{font:16px system-ui,sans-serif;max-width:28rem;margin:3rem auto;padding:0 1rem;color:#1f2933}
.box{border:1px solid #cbd2d9;border-radius:8px;padding:1.25rem}label{display:block;margin:.75rem 0 .25rem}
input{width:100%;padding:.5rem;font:inherit;box-sizing:border-box}button{margin-top:1rem;width:100%;padding:.65rem;font:inherit;background:#334e68;color:#fff;border:0;border-radius:6px}
.note{font-size:.85rem;color:#52606d}</style></head><body>
<p class="note">Local test checkout: no card is charged and nothing leaves this machine.</p>
<div class="box"><h1 style="font-size:1.25rem;margin:0 0 .5rem">${esc(s.line_items_description)}</h1>
<p>Amount due: <strong data-testid="amount">${esc(amount)}</strong></p>
${
  done
    ? `<p data-testid="state">This checkout is ${esc(s.status)}.</p>`
    : `<form method="post" action="/pay/${esc(s.id)}">
<label for="card">Card number (test)</label><input id="card" name="card" value="4242 4242 4242 4242" inputmode="numeric" autocomplete="off">
<button type="submit">Pay ${esc(amount)}</button></form>`
}
${s.cancel_url && !done ? `<p><a href="${esc(s.cancel_url)}">Cancel and go back</a></p>` : ""}</div></body></html>`;
}

function readBody(req) {
  return new Promise((resolve, reject) => {
    let size = 0;
    const chunks = [];
    req.on("data", (c) => {
      size += c.length;
      if (size > 1e6) {
        reject(new Error("too large"));
        req.destroy();
      } else chunks.push(c);
    });
    req.on("end", () => resolve(Buffer.concat(chunks).toString("utf8")));
    req.on("error", reject);
  });
}

const server = http.createServer(async (req, res) => {
  try {
    const url = new URL(req.url ?? "/", publicUrl);
    const path = url.pathname;
    let m;
    if (path.startsWith("/v1/")) {
      if (!/^Bearer sk_\w+/.test(req.headers.authorization ?? ""))
        return send(res, 401, {
          error: { type: "invalid_request_error", message: "Invalid API key provided" },
        });
      if (req.method === "POST" && path === "/v1/checkout/sessions") {
        const [status, body, param] = createSession(parseForm(await readBody(req)));
        return status === 200
          ? send(res, 200, publicSession(body))
          : apiError(res, status, body, param);
      }
      if (req.method === "GET" && (m = path.match(/^\/v1\/checkout\/sessions\/([\w]+)$/))) {
        const s = sessions.get(m[1]);
        return s
          ? send(res, 200, publicSession(s))
          : apiError(res, 404, `No such checkout.session: '${m[1]}'`, "id");
      }
      return apiError(res, 404, `Unrecognized request URL (${req.method}: ${path})`);
    }
    if ((m = path.match(/^\/pay\/([\w]+)$/))) {
      const s = sessions.get(m[1]);
      if (!s) {
        res.writeHead(404, { "content-type": "text/plain" });
        return res.end("No such checkout");
      }
      if (req.method === "GET") {
        res.writeHead(200, { "content-type": "text/html; charset=utf-8" });
        return res.end(checkoutPage(s));
      }
      if (req.method === "POST") {
        await readBody(req);
        const wasOpen = s.status === "open";
        if (wasOpen) await deliver(complete(s));
        res.writeHead(303, { location: s.success_url });
        return res.end();
      }
    }
    if (req.method === "GET" && path === "/__fake/events")
      return send(res, 200, {
        data: [...events.values()].map((e) => ({ ...e, deliveries: e.deliveries })),
      });
    if (req.method === "POST" && (m = path.match(/^\/__fake\/events\/([\w]+)\/deliver$/))) {
      const e = events.get(m[1]);
      return e ? send(res, 200, { status: await deliver(e) }) : apiError(res, 404, "No such event");
    }
    if (req.method === "POST" && (m = path.match(/^\/__fake\/sessions\/([\w]+)\/complete$/))) {
      const s = sessions.get(m[1]);
      if (!s) return apiError(res, 404, "No such checkout.session");
      const deliverNow = url.searchParams.get("deliver") !== "0";
      const e = complete(s);
      return send(res, 200, { event: e, status: deliverNow ? await deliver(e) : null });
    }
    if (req.method === "POST" && (m = path.match(/^\/__fake\/sessions\/([\w]+)\/tamper$/))) {
      const s = sessions.get(m[1]);
      if (!s) return apiError(res, 404, "No such checkout.session");
      const body = JSON.parse((await readBody(req)) || "{}");
      for (const k of TAMPERABLE) if (k in body) s[k] = body[k];
      return send(res, 200, publicSession(s));
    }
    if (req.method === "GET" && path === "/health") return send(res, 200, { ok: true });
    res.writeHead(404, { "content-type": "text/plain" });
    res.end("Not found");
  } catch (e) {
    send(res, 400, { error: { type: "invalid_request_error", message: String(e.message ?? e) } });
  }
});

server.listen(port, "127.0.0.1", () =>
  console.log(`payment fake on ${publicUrl} → webhooks to ${webhookUrl}`),
);
