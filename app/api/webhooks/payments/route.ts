import { handle } from "@/lib/http/handler";
import { readSignedEvent } from "@/lib/http/webhook";
import { recordPaymentEvent } from "@/lib/payments/payment-commands";
import { constructEvent } from "@/lib/payments/provider";

/**
 * POST — the card-payment provider's webhook. No session: the signature is the authentication.
 * Bad or missing signature → 400 and nothing recorded; a repeated event → 200 and nothing new.
 */
export const POST = handle(async (req) => {
  const event = await readSignedEvent(req, "stripe-signature", constructEvent);
  return Response.json(await recordPaymentEvent(event));
});
