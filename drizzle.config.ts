import type { Config } from "drizzle-kit";

export default {
  schema: "./db/schema/index.ts",
  out: "./db/migrations",
  dialect: "postgresql",
  dbCredentials: {
    url: process.env.DATABASE_URL ?? "postgres://fuelwright@127.0.0.1:54329/fuelwright",
  },
  strict: true,
} satisfies Config;
