import { readText } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { handlePaymentWebhook } from "@/lib/payments/service";

/**
 * POST — the card-payment provider's webhook. No session: the signature is the authentication.
 * Bad or missing signature → 400 and nothing recorded; a repeated event → 200 and nothing new.
 */
export const POST = handle(async (req) => {
  const raw = await readText(req, 1024 * 1024, "webhook body");
  return Response.json(await handlePaymentWebhook(raw, req.headers.get("stripe-signature")));
});
