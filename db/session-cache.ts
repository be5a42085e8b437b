import postgres from "postgres";

/**
 * The session look-ups this instance keeps in memory, so that a signed-in request costs no round
 * trip before its own work — and is forgotten the moment anything it read changes:
 *
 * - **Any instance, any writer**: the database announces every committed change to the session,
 *   person, membership, shop and shop-settings tables (`fw_auth_changed`, migration 0017) and
 *   this instance, listening on its own connection, forgets everything it keeps.
 * - **This instance's own writes**: a statement that writes one of those tables is seen as it is
 *   sent (`noteStatement`); everything kept is forgotten at once, and nothing is kept or used
 *   for a while after (`HOLD_MS`), so that the writer's next request cannot meet a look-up made
 *   while the write was on its way — whenever the announcement arrives.
 * - **No listener, no memory**: until the listener has said LISTEN, and from the moment its
 *   connection drops until it is back, every look-up goes to the database.
 *
 * A look-up is kept only if nothing was forgotten while it was being read (`generation`), so a
 * row read before a change cannot be stored after it. Only the Next.js server keeps look-ups
 * (NEXT_RUNTIME): a script or a test process reads the database every time.
 */

/** What a look-up is kept as: the database's row for one session token. */
type Row = object;

/** After this instance writes a table the look-up reads, nothing is kept or used for this long. */
const HOLD_MS = 2000;
/** At most this many sessions kept; the oldest go first. */
const MAX_KEPT = 10_000;
const CHANNEL = "fw_auth_changed";

interface State {
  kept: Map<string, Row>;
  generation: number;
  listening: boolean;
  heldUntil: number;
  /** The listening connection's server process (so a test can cut exactly that one). */
  pid?: number;
  listener?: postgres.Sql;
  retry?: ReturnType<typeof setTimeout>;
}

// On globalThis: the state outlives a development server's module reloads, as the client does.
const g = globalThis as unknown as { fuelwrightSessionCache?: State };
const state: State = (g.fuelwrightSessionCache ??= {
  kept: new Map(),
  generation: 0,
  listening: false,
  heldUntil: 0,
});

function forget() {
  state.generation += 1;
  state.kept.clear();
}

const enabled = () => process.env.NEXT_RUNTIME === "nodejs" && process.env.SESSION_CACHE !== "off";

function usable(now = Date.now()) {
  return state.listening && now >= state.heldUntil;
}

/**
 * The statements that change what a look-up reads, as Drizzle, the auth library's adapter and
 * our own SQL write them. A new session (insert into "session") changes no look-up kept.
 */
const WRITES =
  /^\s*(?:with\b[\s\S]*?\)\s*)?(?:update|delete\s+from|insert\s+into|truncate(?:\s+table)?)\s+(?:"?public"?\.)?"?(session|user|member|organization|shop_settings)"?[\s(]/i;

/** Called by the database client with every statement it sends. */
export function noteStatement(text: string): void {
  const m = WRITES.exec(text);
  if (!m) return;
  if (m[1]!.toLowerCase() === "session" && /^\s*insert/i.test(text)) return;
  forget();
  state.heldUntil = Date.now() + HOLD_MS;
}

function listen(url: string) {
  if (state.listener) return;
  // postgres.js takes these two (its own LISTEN uses them) but does not declare them.
  const notices: object = {
    onnotify: () => forget(),
    onclose: () => {
      // Changes made while the connection was down were not heard: keep nothing until it is back.
      state.listening = false;
      forget();
      later(sql);
    },
  };
  const sql = postgres(url, {
    max: 1,
    idle_timeout: 0,
    max_lifetime: null,
    fetch_types: false,
    connect_timeout: 5,
    onnotice: () => {},
    ...notices,
  });
  state.listener = sql;
  void start(sql);
}

function later(sql: postgres.Sql) {
  state.retry ??= setTimeout(() => {
    state.retry = undefined;
    void start(sql);
  }, 1000);
}

async function start(sql: postgres.Sql) {
  try {
    await sql.unsafe(`listen ${CHANNEL}`);
    const [row] = await sql<{ pid: number }[]>`select pg_backend_pid() as pid`;
    state.pid = row?.pid;
    forget();
    state.listening = true;
  } catch {
    state.listening = false;
    later(sql);
  }
}

/**
 * The kept row for `token`, or the database's (`read`), kept when that is safe. `url` is the
 * database the listener connects to.
 */
export async function keptLookup<T extends Row>(
  url: string,
  token: string,
  read: () => Promise<T | null>,
): Promise<T | null> {
  if (!enabled()) return read();
  if (!state.listener) listen(url);
  if (usable()) {
    const hit = state.kept.get(token);
    if (hit) return hit as T;
  }
  const generation = state.generation;
  const row = await read();
  if (row && usable() && generation === state.generation) {
    if (state.kept.size >= MAX_KEPT) state.kept.delete(state.kept.keys().next().value!);
    state.kept.set(token, Object.freeze(row));
  }
  return row;
}

/** For the tests: how many look-ups are kept, whether the listener is heard, and the rest. */
export function sessionCacheState() {
  return {
    kept: state.kept.size,
    listening: state.listening,
    held: Date.now() < state.heldUntil,
    generation: state.generation,
    pid: state.pid,
  };
}
