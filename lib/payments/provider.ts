import "server-only";

import Stripe from "stripe";

import { serverEnv } from "@/lib/env";
import { HttpError } from "@/lib/http/http-error";

const FAKE_URL = "http://127.0.0.1:12111";
let client: Stripe | undefined;

/** Where payments go: the local fake unless a real secret key is configured without an endpoint. */
export function paymentsEndpoint(): URL | null {
  const env = serverEnv();
  if (env.PAYMENTS_API_URL) return new URL(env.PAYMENTS_API_URL);
  return process.env.STRIPE_SECRET_KEY ? null : new URL(FAKE_URL);
}

/** The official Stripe SDK, pointed at the local fake by default. */
export function payments(): Stripe {
  if (client) return client;
  const env = serverEnv();
  const url = paymentsEndpoint();
  client = new Stripe(env.STRIPE_SECRET_KEY, {
    maxNetworkRetries: url ? 0 : 2,
    telemetry: false,
    timeout: 10_000,
    ...(url
      ? {
          host: url.hostname,
          port: Number(url.port || (url.protocol === "https:" ? 443 : 80)),
          protocol: url.protocol.replace(":", "") as "http" | "https",
        }
      : {}),
  });
  return client;
}

/** Checks a webhook's signature (and its age) and parses it; a missing or bad signature → 400. */
export function verifiedEvent(rawBody: string, signature: string | null): Stripe.Event {
  if (!signature) throw new HttpError(400, "bad_signature", "The webhook has no signature header");
  try {
    return payments().webhooks.constructEvent(
      rawBody,
      signature,
      serverEnv().STRIPE_WEBHOOK_SECRET,
    );
  } catch {
    throw new HttpError(400, "bad_signature", "The webhook signature does not match");
  }
}
