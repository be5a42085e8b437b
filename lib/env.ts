import { z } from "zod";

/** The webhook secret `next dev` falls back to; known to everyone, so production refuses it. */
const DEV_WEBHOOK_SECRET = "whsec_fuelwright_local_fake";
/** Values that have stood in this repository as secrets: never a production secret. */
const KNOWN_PLACEHOLDERS = new Set([
  DEV_WEBHOOK_SECRET,
  "whsec_fuelwright_test_secret",
  "test-secret-test-secret-test-secret-0123",
  "unit-secret-unit-secret-unit-secret-0123",
  "bench-secret-bench-secret-bench-secret-01",
  "build-time-placeholder-never-served-0000",
]);
/** The shortest secret production accepts (a generated one is 64 hex digits). */
export const MIN_SECRET_LENGTH = 32;

/**
 * Why a secret may not sign anything in production: a value known from this repository, too
 * short, or too uniform to be random. Null when it will do.
 */
export function secretProblem(name: string, value: string): string | null {
  if (KNOWN_PLACEHOLDERS.has(value))
    return `${name} is a default or placeholder value; generate one (npm start does, into .data/)`;
  if (value.length < MIN_SECRET_LENGTH)
    return `${name} must be at least ${MIN_SECRET_LENGTH} characters`;
  if (new Set(value).size < 8) return `${name} is too uniform to be a random secret`;
  return null;
}

const EnvSchema = z.object({
  DATABASE_URL: z.string().url("DATABASE_URL must be a postgres:// URL"),
  BETTER_AUTH_SECRET: z.string().min(32, "BETTER_AUTH_SECRET must be at least 32 characters"),
  APP_URL: z.string().url().default("http://localhost:3000"),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  MAIL_FROM: z.string().default("Fuelwright <no-reply@fuelwright.test>"),
  /**
   * Card payments. Without STRIPE_SECRET_KEY the app talks to the local payment fake at
   * PAYMENTS_API_URL (started by `npm start` and `npm test`); a real key and no PAYMENTS_API_URL
   * switch to the real service.
   */
  STRIPE_SECRET_KEY: z.string().min(8).default("sk_test_fuelwright_local_fake"),
  /**
   * The webhook's signing secret. `npm start` and `npm test` generate one per checkout (into
   * .data/) and give the same to the local payment fake; with the real service it is the
   * endpoint's secret from its dashboard. The default serves `next dev` only: production refuses it.
   */
  STRIPE_WEBHOOK_SECRET: z.string().min(8).default(DEV_WEBHOOK_SECRET),
  PAYMENTS_API_URL: z.string().url("PAYMENTS_API_URL must be an http(s) URL").optional(),
  /** Object storage for uploads: the local S3 fake by default; a real endpoint and keys switch. */
  S3_ENDPOINT: z
    .string()
    .url("S3_ENDPOINT must be an http(s) URL")
    .default("http://127.0.0.1:4569"),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("fuelwright-uploads"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  /** "off" only for local experiments and the system tests: the auth rate limits stay on elsewhere. */
  AUTH_RATE_LIMIT: z.enum(["on", "off"]).default("on"),
  /** Minutes between sweeps of quotes past their date (instrumentation.ts); 0 turns it off (tests run it themselves). */
  QUOTE_SWEEP_MINUTES: z.coerce.number().int().min(0).max(1440).default(5),
  /**
   * Behind a reverse proxy: the request header it writes the client's address into (e.g.
   * `x-forwarded-for`, `x-real-ip`). Unset (the default), the client is the socket's peer and
   * every forwarding header is ignored. See lib/http/client-address.ts.
   */
  TRUSTED_PROXY_HEADER: z
    .string()
    .trim()
    .toLowerCase()
    .regex(/^[a-z0-9-]*$/, "TRUSTED_PROXY_HEADER must be a header name such as x-forwarded-for")
    .default(""),
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
});

export type ServerEnv = z.infer<typeof EnvSchema>;
let cached: ServerEnv | undefined;

/** Validated server environment; throws one clear message listing every bad variable. */
export function serverEnv(): ServerEnv {
  if (cached) return cached;
  // `next build` evaluates route modules without serving them; the server validates at boot.
  if (process.env.NEXT_PHASE === "phase-production-build") {
    return EnvSchema.parse({
      DATABASE_URL: "postgres://build@127.0.0.1:1/build",
      BETTER_AUTH_SECRET: "build-time-placeholder-never-served-0000",
      ...process.env,
    });
  }
  const parsed = EnvSchema.safeParse(process.env);
  const problems = parsed.success
    ? productionProblems(parsed.data)
    : parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
  if (problems.length || !parsed.success)
    throw new Error(
      `Fuelwright cannot start: bad environment\n${problems.map((p) => `  ${p}`).join("\n")}`,
    );
  cached = parsed.data;
  return cached;
}

/** In production the signing secrets must be the install's own: none left at a default. */
export function productionProblems(env: ServerEnv): string[] {
  if (env.NODE_ENV !== "production") return [];
  return [
    secretProblem("BETTER_AUTH_SECRET", env.BETTER_AUTH_SECRET),
    secretProblem("STRIPE_WEBHOOK_SECRET", env.STRIPE_WEBHOOK_SECRET),
  ].filter((p): p is string => p !== null);
}
