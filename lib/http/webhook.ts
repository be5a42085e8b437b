import { readText } from "./body";
import { HttpError } from "./http-error";

const MAX_WEBHOOK_BYTES = 1024 * 1024;

/**
 * A webhook's body, read raw and checked against its signature header by `verify` (the
 * provider SDK's check). The signature is the webhook's authentication: without one, or with
 * one that does not match, the answer is 400 `bad_signature` and nothing runs.
 */
export async function readSignedEvent<T>(
  req: Request,
  header: string,
  verify: (rawBody: string, signature: string) => T,
): Promise<T> {
  const raw = await readText(req, MAX_WEBHOOK_BYTES, "webhook body");
  const signature = req.headers.get(header);
  if (!signature) throw new HttpError(400, "bad_signature", "The webhook has no signature header");
  try {
    return verify(raw, signature);
  } catch {
    throw new HttpError(400, "bad_signature", "The webhook signature does not match");
  }
}
