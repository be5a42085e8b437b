import { drizzleAdapter } from "better-auth/adapters/drizzle";

import { db } from "./index";
import * as schema from "./schema";

/** better-auth's storage: its tables in our schema, through the one database client. */
export const authAdapter = drizzleAdapter(db, { provider: "pg", schema });
