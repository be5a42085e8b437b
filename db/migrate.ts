import { drizzle } from "drizzle-orm/postgres-js";
import { migrate } from "drizzle-orm/postgres-js/migrator";
import postgres from "postgres";

import { normaliseStoredPhones } from "./normalise-phones";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("DATABASE_URL is not set");
  process.exit(1);
}
const sql = postgres(url, { max: 1, onnotice: () => {} });
try {
  await migrate(drizzle(sql), {
    migrationsFolder: new URL("./migrations", import.meta.url).pathname,
  });
  const phones = await normaliseStoredPhones(sql);
  console.log(
    `migrations: up to date${phones ? ` (${phones} phone numbers stored as E.164)` : ""}`,
  );
} finally {
  await sql.end();
}
