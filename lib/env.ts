import { z } from "zod";

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
  STRIPE_WEBHOOK_SECRET: z.string().min(8).default("whsec_fuelwright_local_fake"),
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
  /** "off" only in tests: better-auth's sign-in rate limit stays on everywhere else. */
  AUTH_RATE_LIMIT: z.enum(["on", "off"]).default("on"),
  /** Minutes between sweeps of quotes past their date (instrumentation.ts); 0 turns it off (tests run it themselves). */
  QUOTE_SWEEP_MINUTES: z.coerce.number().int().min(0).max(1440).default(5),
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
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Fuelwright cannot start: bad environment\n${lines}`);
  }
  cached = parsed.data;
  return cached;
}
