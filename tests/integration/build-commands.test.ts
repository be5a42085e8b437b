import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { INPUTS_SCHEMA_VERSION } from "@/lib/builds/stored-inputs";

import { boostedSix } from "../calc/fixtures";
import { actionManifest, callAction, type ActionRef } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, request, signIn, type Client } from "../helpers/http";

/**
 * One command per write: the JSON API and the server action run the same command, so they answer
 * alike — the same `{ build }` on success, the same 409 with the current build on a stale version,
 * the same refusal of a status move — and a command's writes land together or not at all.
 */

let tuner: Client, counter: Client, outsider: Client;
let customerId: string;
beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, counter, outsider] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const [c] =
    await sql`select id from customers where shop_id = 'demo-shop-ridgeback' and user_id is null order by name limit 1`;
  customerId = c!.id;
});
afterAll(async () => {
  await sql.end();
});

async function newBuild(title: string) {
  const r = await request(tuner, "POST", "/api/v1/builds", {
    customerId,
    title,
    inputs: boostedSix,
  });
  expect(r.status).toBe(201);
  return r.json.build as { id: string; version: number; inputs: unknown };
}

/** The state a server action answered with, in full. */
interface State {
  ok: boolean;
  status?: number;
  code?: string;
  message?: string;
  fieldErrors?: Record<string, string[]>;
  data?: { build: Record<string, unknown> & { version: number } };
  current?: Record<string, unknown> & { version: number };
}

function actionRef(file: string, name: string, page: string): ActionRef {
  const found = actionManifest().find((r) => r.file === file && r.name === name);
  expect(found, `${file}#${name} is in the build's action manifest`).toBeTruthy();
  return { ...found!, page };
}

async function saveByAction(body: Record<string, unknown> & { id: string }): Promise<State> {
  const ref = actionRef("lib/builds/build-actions.ts", "saveBuildAction", `/builds/${body.id}`);
  const r = await callAction(tuner, ref, [{ ok: false }, body]);
  expect(r.http).toBeLessThan(500);
  expect(r.state, "the action answered with a state").toBeTruthy();
  return r.state as State;
}

const keysOf = (o: object) => Object.keys(o).sort();

describe("saving a build: the API and the editor's action answer alike", () => {
  it("success, a stale version and a forbidden status move", async () => {
    const tag = Date.now().toString(36);
    const viaApi = await newBuild(`Same answer API ${tag}`);
    const viaAction = await newBuild(`Same answer action ${tag}`);
    const more = { ...boostedSix, target: { ...boostedSix.target, powerKw: 500 } };

    // Success: the build as saved, with its new version.
    const a = await request(tuner, "PATCH", `/api/v1/builds/${viaApi.id}`, {
      version: 1,
      title: "Saved",
      inputs: more,
    });
    const b = await saveByAction({ id: viaAction.id, version: 1, title: "Saved", inputs: more });
    expect(a.status).toBe(200);
    expect(b.ok).toBe(true);
    expect(keysOf(a.json)).toEqual(["build"]);
    expect(keysOf(b.data!)).toEqual(["build"]);
    expect(keysOf(b.data!.build)).toEqual(keysOf(a.json.build));
    for (const s of [a.json.build, b.data!.build]) {
      expect(s).toMatchObject({ version: 2, title: "Saved", status: "draft" });
      expect(s.inputs).toMatchObject({ target: { powerKw: 500 } });
      expect(typeof s.updatedAt).toBe("string"); // plain data, the same in JSON and in the action
    }

    // A save from version 1 again: 409 with the build as it is now; nothing is overwritten.
    const before = await fingerprint(["builds", "build_revisions"]);
    const staleA = await request(tuner, "PATCH", `/api/v1/builds/${viaApi.id}`, {
      version: 1,
      inputs: boostedSix,
    });
    const staleB = await saveByAction({ id: viaAction.id, version: 1, inputs: boostedSix });
    expect(staleA.status).toBe(409);
    expect(staleB).toMatchObject({ ok: false, status: 409, code: staleA.json.error.code });
    expect(staleA.json.error.code).toBe("conflict");
    expect(staleB.message).toBe(staleA.json.error.message);
    expect(staleA.json.error.message).toMatch(
      /Someone saved this build meanwhile \(now version 2\)/,
    );
    expect(keysOf(staleB.current!)).toEqual(keysOf(staleA.json.current));
    for (const cur of [staleA.json.current, staleB.current!]) {
      expect(cur).toMatchObject({ version: 2, title: "Saved", updatedByName: "Teodor Vance" });
      expect(cur.inputs).toMatchObject({ target: { powerKw: 500 } });
    }
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);

    // Draft → verified skips the workflow: the same refusal from both, and nothing written.
    const skipA = await request(tuner, "PATCH", `/api/v1/builds/${viaApi.id}`, {
      version: 2,
      status: "verified",
    });
    const skipB = await saveByAction({ id: viaAction.id, version: 2, status: "verified" });
    expect(skipA.status).toBe(422);
    expect(skipA.json.error).toMatchObject({
      code: "invalid_transition",
      message: "A build cannot go from Draft to Verified",
    });
    expect(skipB).toMatchObject({
      ok: false,
      status: 422,
      code: "invalid_transition",
      message: "A build cannot go from Draft to Verified",
    });
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });

  it("bad input names the same fields through both doors", async () => {
    const b = await newBuild(`Fields ${Date.now().toString(36)}`);
    const bad = { ...boostedSix, injectors: { ...boostedSix.injectors, count: 0 } };
    const a = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: bad });
    const s = await saveByAction({ id: b.id, version: 1, inputs: bad });
    expect(a.status).toBe(422);
    expect(s.status).toBe(422);
    const paths = a.json.error.issues.map((i: { path: string }) => i.path);
    expect(paths).toContain("inputs.injectors.count");
    expect(Object.keys(s.fieldErrors!)).toEqual(paths);
  });

  it("a save writes only the fields sent: a title-only save keeps the inputs, vehicle and result", async () => {
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId,
      title: `Partial ${Date.now().toString(36)}`,
      vehicle: "Test car",
      inputs: boostedSix,
    });
    const id = made.json.build.id as string;
    const r = await request(tuner, "PATCH", `/api/v1/builds/${id}`, {
      version: 1,
      title: "Renamed",
    });
    expect(r.status).toBe(200);
    expect(r.json.build).toMatchObject({ version: 2, title: "Renamed", vehicle: "Test car" });
    expect(r.json.build.inputs).toEqual(made.json.build.inputs);
    expect(r.json.build.result).toEqual(made.json.build.result);
    // The revision keeps the inputs it was saved with.
    const [rev] =
      await sql`select inputs, inputs_schema_version, sizing_settings from build_revisions where build_id = ${id} and version = 2`;
    expect(rev!.inputs).toEqual(made.json.build.inputs);
    expect(rev!.inputs_schema_version).toBe(INPUTS_SCHEMA_VERSION);
    // ... and the shop settings it was sized with.
    expect(rev!.sizing_settings).toEqual(made.json.build.sizingSettings);
  });

  it("another shop's customer is a field error on customerId, and nothing is created", async () => {
    const before = await fingerprint(["builds", "build_revisions"]);
    const r = await request(outsider, "POST", "/api/v1/builds", { customerId, title: "Not yours" });
    expect(r.status).toBe(422);
    expect(r.json.error.issues).toEqual([
      { path: "customerId", message: "That customer is not in this shop" },
    ]);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });
});

/** A fitted build with an uploaded and analysed pull, ready to be verified. */
async function analysedLog(tag: string) {
  const b = await newBuild(`Verify ${tag}`);
  await sql`update builds set status = 'fitted' where id = ${b.id}`;
  const rows = ["RPM,Inj Duty,Lambda", "rpm,%,lambda"];
  for (let i = 0; i <= 20; i++) rows.push(`${3000 + i * 200},${40 + i * 2},0.80`);
  const up = await fetch(`${BASE_URL}/api/v1/builds/${b.id}/datalogs`, {
    method: "POST",
    body: rows.join("\n") + "\n",
    headers: {
      cookie: tuner.cookie,
      origin: BASE_URL,
      "x-forwarded-for": tuner.ip,
      "content-type": "text/csv",
      "x-file-name": `verify-${tag}.csv`,
    },
  });
  expect(up.status).toBe(201);
  const log = (await up.json()).datalog.id as string;
  const a = await request(tuner, "POST", `/api/v1/datalogs/${log}/analysis`, {
    mapping: {
      rpm: "RPM",
      duty: { column: "Inj Duty", kind: "duty_pct" },
      mixture: { column: "Lambda", kind: "lambda" },
    },
  });
  expect(a.status).toBe(200);
  return { build: b.id, log };
}

async function verifyState(build: string, log: string) {
  const [b] = await sql`select status, version from builds where id = ${build}`;
  const [{ n }] =
    (await sql`select count(*)::int as n from build_revisions where build_id = ${build}`) as unknown as [
      { n: number },
    ];
  const [d] = await sql`select verified_at, verified_by from datalogs where id = ${log}`;
  return { status: b!.status, version: b!.version, revisions: n, verifiedAt: d!.verified_at };
}

describe("verifying a build with a dyno log", () => {
  it("writes the revision and marks the log together; a verify refused midway leaves neither", async () => {
    const { build, log } = await analysedLog(Date.now().toString(36));
    const before = await verifyState(build, log);
    expect(before).toMatchObject({ status: "fitted", version: 1, revisions: 1, verifiedAt: null });

    // The database refuses the log's mark, after the build's save in the same command.
    const fn = `refuse_verify_${log.replace(/-/g, "")}`;
    await sql.unsafe(`
      create function ${fn}() returns trigger language plpgsql as $$
      begin
        if new.id = '${log}' and new.verified_at is not null then
          raise exception 'refused by the test';
        end if;
        return new;
      end $$;
      create trigger ${fn} before update on datalogs for each row execute function ${fn}();
    `);
    try {
      const refused = await request(tuner, "POST", `/api/v1/datalogs/${log}/verify`);
      expect(refused.status).toBeGreaterThanOrEqual(400);
    } finally {
      await sql.unsafe(`drop trigger ${fn} on datalogs; drop function ${fn}();`);
    }
    // Neither the revision nor the status nor the mark: the build's save was rolled back too.
    expect(await verifyState(build, log)).toEqual(before);

    // Through the dyno screen's action, with nothing in the way: both are written.
    const ref = actionRef(
      "lib/dyno/dyno-actions.ts",
      "verifyDatalogAction",
      `/builds/${build}/dyno`,
    );
    const r = await callAction(tuner, ref, [{ ok: false }, { id: log }]);
    const state = r.state as State;
    expect(state).toMatchObject({ ok: true, data: { build: { status: "verified", version: 2 } } });
    const after = await verifyState(build, log);
    expect(after).toMatchObject({ status: "verified", version: 2, revisions: 2 });
    expect(after.verifiedAt).not.toBeNull();
    const [rev] =
      await sql`select status, note from build_revisions where build_id = ${build} and version = 2`;
    expect(rev).toMatchObject({
      status: "verified",
      note: expect.stringMatching(/^Verified with dyno log verify-/),
    });
  });

  it("an unanalysed log or a build that is not fitted is refused with 409, and nothing changes", async () => {
    const { build, log } = await analysedLog(`${Date.now().toString(36)}-b`);
    await sql`update datalogs set analysis = null where id = ${log}`;
    const before = await fingerprint(["builds", "build_revisions", "datalogs"]);
    const notAnalysed = await request(tuner, "POST", `/api/v1/datalogs/${log}/verify`);
    expect(notAnalysed.status).toBe(409);
    expect(notAnalysed.json.error.code).toBe("not_analysed");
    await sql`update builds set status = 'quoted' where id = ${build}`;
    const a = await request(tuner, "POST", `/api/v1/datalogs/${log}/analysis`, {
      mapping: { rpm: "RPM", duty: { column: "Inj Duty", kind: "duty_pct" } },
    });
    expect(a.status).toBe(200);
    const before2 = await fingerprint(["builds", "build_revisions", "datalogs"]);
    const notFitted = await request(tuner, "POST", `/api/v1/datalogs/${log}/verify`);
    expect(notFitted.status).toBe(409);
    expect(notFitted.json.error.message).toBe(
      "Only a fitted build is verified; this one is quoted",
    );
    expect(await fingerprint(["builds", "build_revisions", "datalogs"])).toBe(before2);
    expect(before).not.toBe(before2); // the analysis in between was written
  });
});

describe("status moves need their precondition, checked by the save command", () => {
  const TABLES = ["builds", "build_revisions", "quotes", "datalogs"];
  const move = (id: string, version: number, status: string) =>
    request(tuner, "PATCH", `/api/v1/builds/${id}`, { version, status });
  /** Asserts the move is refused with 422 invalid_transition saying `why`, and writes nothing. */
  async function refused(id: string, version: number, status: string, why: RegExp) {
    const before = await fingerprint(TABLES);
    const r = await move(id, version, status);
    expect(r.status, `${status}: ${r.json?.error?.message}`).toBe(422);
    expect(r.json.error.code).toBe("invalid_transition");
    expect(r.json.error.message).toMatch(why);
    expect(await fingerprint(TABLES)).toBe(before);
  }
  async function allowed(id: string, version: number, status: string) {
    const r = await move(id, version, status);
    expect(r.status, `${status}: ${r.json?.error?.message}`).toBe(200);
    expect(r.json.build).toMatchObject({ status, version: version + 1 });
  }
  /** The build's quote (made by the counter from the build), set to `status` for the next step. */
  async function quoteFor(buildId: string) {
    const r = await request(counter, "POST", "/api/v1/quotes", { buildId });
    expect(r.status).toBe(201);
    const id = r.json.quote.id as string;
    return {
      id,
      set: (status: string, validUntil = "2099-12-31") =>
        sql`update quotes set status = ${status}, valid_until = ${validUntil} where id = ${id}`,
    };
  }

  it("draft → sized → quoted → ordered → fitted → verified, each refused without its precondition and allowed with it", async () => {
    const b = await newBuild(`Moves ${Date.now().toString(36)}`);
    await allowed(b.id, 1, "sized");

    // Quoted: a quote for this build, sent and within its date.
    await refused(
      b.id,
      2,
      "quoted",
      /Quoted needs a quote for this build sent.*no quote for it yet/,
    );
    const q = await quoteFor(b.id);
    await refused(b.id, 2, "quoted", /still a draft; send it first/);
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    await q.set("sent", yesterday); // past its date: as good as expired, whatever is stored
    await refused(b.id, 2, "quoted", /declined or expired/);
    await q.set("sent");
    await allowed(b.id, 2, "quoted");

    // Ordered: that quote accepted (or its deposit paid, or ordered).
    await refused(b.id, 3, "ordered", /accepted by the customer.*sent and waiting/);
    await q.set("accepted", yesterday);
    await refused(b.id, 3, "ordered", /Ordered needs/);
    await q.set("accepted");
    await allowed(b.id, 3, "ordered");

    // Fitted: the order still stands.
    await q.set("declined");
    await refused(b.id, 4, "fitted", /Fitted needs the order to stand/);
    await q.set("deposit_paid");
    await allowed(b.id, 4, "fitted");

    // Verified: a dyno log of this build marked verified.
    await refused(b.id, 5, "verified", /needs a verified dyno log/);
    const [log] =
      await sql`insert into datalogs (shop_id, build_id, object_key, file_name, size_bytes, sha256, headers, row_count, verified_at)
        values ('demo-shop-ridgeback', ${b.id}, ${`test/${b.id}.csv`}, 'verified.csv', 1, 'x', '[]', 1, now()) returning id`;
    expect(log).toBeTruthy();
    await allowed(b.id, 5, "verified");

    // Reworked: back to draft, and a log verified before the rework no longer verifies it.
    await allowed(b.id, 6, "draft");
    await sql`update builds set status = 'fitted' where id = ${b.id}`;
    await refused(b.id, 7, "verified", /needs a verified dyno log/);
  });

  it("the editor's action refuses alike, with the reason on the status field", async () => {
    const b = await newBuild(`Moves action ${Date.now().toString(36)}`);
    await allowed(b.id, 1, "sized");
    const before = await fingerprint(TABLES);
    const s = await saveByAction({ id: b.id, version: 2, status: "quoted" });
    expect(s).toMatchObject({ ok: false, status: 422, code: "invalid_transition" });
    expect(s.message).toMatch(/Quoted needs a quote for this build sent/);
    expect(s.fieldErrors?.status?.[0]).toBe(s.message);
    expect(await fingerprint(TABLES)).toBe(before);
  });

  it("a stale version is still a conflict (409) before any rule", async () => {
    const b = await newBuild(`Moves stale ${Date.now().toString(36)}`);
    await allowed(b.id, 1, "sized");
    const r = await move(b.id, 1, "quoted");
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe("conflict");
  });

  it("Mark verified on the dyno screen is refused for a draft build, and nothing changes", async () => {
    const { build, log } = await analysedLog(`${Date.now().toString(36)}-d`);
    await sql`update builds set status = 'draft' where id = ${build}`;
    const before = await fingerprint(TABLES);
    const r = await request(tuner, "POST", `/api/v1/datalogs/${log}/verify`);
    expect(r.status).toBe(409);
    expect(r.json.error.message).toBe("Only a fitted build is verified; this one is draft");
    expect(await fingerprint(TABLES)).toBe(before);
  });
});
