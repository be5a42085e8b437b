import "server-only";

import Stripe from "stripe";

import { serverEnv } from "@/lib/env";

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

/**
 * Checks a webhook's signature (and its age) with the SDK and parses the event; throws the
 * SDK's error when it does not match (the route answers 400, see lib/http/webhook.ts).
 */
export function constructEvent(rawBody: string, signature: string): Stripe.Event {
  return payments().webhooks.constructEvent(rawBody, signature, serverEnv().STRIPE_WEBHOOK_SECRET);
}
