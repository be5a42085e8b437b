import Papa from "papaparse";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { z } from "zod";

import { FuelSystemInputSchema } from "@/lib/calc";
import { AcceptInvitationSchema, SignUpSchema } from "@/lib/validations/auth";
import {
  BuildCreateSchema,
  BuildDraftFormSchema,
  BuildListQuery,
  BuildRefSchema,
  BuildSaveSchema,
  RevisionRestoreSchema,
  SpecSheetQuery,
} from "@/lib/validations/builds";
import { BlendRequestSchema } from "@/lib/validations/calc";
import {
  CustomerCreateSchema,
  CustomerIdSchema,
  CustomerListQuery,
  CustomerPatchSchema,
  CustomerSchema,
  CustomerUpdateSchema,
} from "@/lib/validations/customers";
import { DatalogAnalysisSchema, DatalogRefSchema } from "@/lib/validations/datalogs";
import { KitChoiceSchema } from "@/lib/validations/kit";
import {
  BalanceReturnSchema,
  CreditNoteCreateSchema,
  IdSchema,
  InvoiceCreateSchema,
  InvoiceEditSchema,
  InvoiceIssueSchema,
  JobFitSchema,
  JobOpenSchema,
  MailRetrySchema,
  NoticeOptSchema,
  PurchaseOrderCancelSchema,
  PurchaseOrderCreateSchema,
  PurchaseOrderReceiveSchema,
  SupplierCreateSchema,
  SupplierUpdateSchema,
} from "@/lib/validations/operations";
import {
  CSV_COLUMNS,
  FlatPartSchema,
  PartFieldsSchema,
  PartIdSchema,
  PartListQuery,
  PartUpdateSchema,
} from "@/lib/validations/parts";
import {
  DepositReturnSchema,
  QuoteCreateSchema,
  QuoteEditSchema,
  QuoteIdSchema,
  QuoteListQuery,
  QuoteResponseSchema,
  QuoteStatusSchema,
} from "@/lib/validations/quotes";
import {
  InviteSchema,
  MemberRemoveSchema,
  MemberRoleSchema,
  ShopSettingsPatchSchema,
  ShopSettingsSchema,
  UnitsSchema,
} from "@/lib/validations/settings";
import {
  ShareLinkCreateSchema,
  ShareLinkDaysSchema,
  ShareLinkRevokeSchema,
} from "@/lib/validations/shares";
import {
  NextPowerStepSchema,
  TuneLimitsSaveSchema,
  TunePullRefSchema,
  TunePullUpdateSchema,
  TuneSessionQuery,
} from "@/lib/validations/tune";
import { VehicleAddSchema, VehicleIdSchema, VehicleUpdateSchema } from "@/lib/validations/vehicles";

import { actionManifest, callAction, formOf, type ActionResult } from "../helpers/actions";
import { appTables, changedTables, sql, tableHashes } from "../helpers/db";
import { BASE_URL, request, signIn, type Client } from "../helpers/http";
import { solidPng } from "../helpers/png";
import {
  bodyOf,
  casesFor,
  DATE_TEXT,
  getAt,
  MAX_UUID,
  NIL_UUID,
  rng,
  sweepsFor,
  type Case,
  type Path,
} from "../helpers/schema-edges";
import { ACTIONS, makeFixtures, ROUTES, SEED_SETTINGS_FORM, type Fx } from "../helpers/surface";

/**
 * Schema-driven fuzz: for every route and server action of the surface (tests/helpers/surface.ts),
 * inputs made from the zod schema it parses with — each field at and just past its edges (see
 * tests/helpers/schema-edges.ts) in an otherwise valid body, ids in paths, query strings and
 * uploads likewise. Whatever comes back: never a 5xx (nor a server error inside a 200 action
 * response), never a stack trace, a 4xx in the one JSON error shape naming the field (routes)
 * or field errors (actions) — and a refused request changes no row of any table.
 *
 * Deterministic: FUZZ_SEED (default below) replays a run; FUZZ_CASES sets the cases per surface.
 */
const SEED = Number(process.env.FUZZ_SEED ?? 16_016);
const PER = Number(process.env.FUZZ_CASES ?? 8);

let owner: Client;
let fx: Fx;
let tables: string[];
let hashes: Record<string, string>;
const restore: (() => Promise<unknown>)[] = [];

beforeAll(async () => {
  owner = await signIn("owner@demo.fuelwright.test");
  const [tuner, counter] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
  ]);
  fx = await makeFixtures({ tuner, counter });
  tables = await appTables();
  // What the fuzz may change for good in the demo shop (settings, logo, the owner's units) is put back after.
  const [settings] =
    await sql`select to_jsonb(s) as j from shop_settings s where shop_id = 'demo-shop-ridgeback'`;
  const [org] =
    await sql`select to_jsonb(o) as j from organization o where id = 'demo-shop-ridgeback'`;
  const [me] =
    await sql`select to_jsonb(u) as j from "user" u where email = 'owner@demo.fuelwright.test'`;
  const logos =
    await sql`select coalesce(jsonb_agg(to_jsonb(l)), '[]'::jsonb) as j from shop_logos l where shop_id = 'demo-shop-ridgeback'`;
  restore.push(
    () => restoreRow("shop_settings", "shop_id", settings!.j),
    () => restoreRow("organization", "id", org!.j),
    () => restoreRow("user", "id", me!.j),
    async () => {
      await sql`delete from shop_logos where shop_id = 'demo-shop-ridgeback'`;
      await sql`insert into shop_logos select * from jsonb_populate_recordset(null::shop_logos, ${logos[0]!.j})`;
    },
  );
  hashes = await tableHashes(tables);
}, 120_000);

afterAll(async () => {
  for (const r of restore) await r();
  await sql.end();
});

/** Puts a row back as it was (every column), by its key. */
async function restoreRow(table: string, key: string, row: Record<string, unknown>) {
  const cols = (
    await sql<
      { c: string }[]
    >`select column_name as c from information_schema.columns where table_schema = 'public' and table_name = ${table}`
  ).map((r) => `"${r.c}"`);
  await sql.unsafe(
    `update "${table}" set (${cols.join(", ")}) = (select ${cols.join(", ")} from jsonb_populate_record(null::"${table}", $1::jsonb)) where "${key}" = $2`,
    [row as never, row[key] as string],
  );
}

// ── What each surface parses with ─────────────────────────────────────────────────────────────
const isId = (p: Path) => p[0] === "id";
/** Routes whose JSON body is parsed by a schema (the path's id is not the body's). */
const BODY: Record<
  string,
  { schema: z.ZodType; base?: (f: Fx) => unknown; skip?: (p: Path) => boolean }
> = {
  "POST /api/v1/builds": { schema: BuildCreateSchema },
  // No route at the address: whatever the body, a JSON 404 (never the HTML page).
  "PUT /api/[...unknown]": { schema: z.object({ x: z.string().optional() }) },
  "PATCH /api/[...unknown]": { schema: z.object({ x: z.string().optional() }) },
  "PATCH /api/v1/builds/[id]": { schema: BuildSaveSchema, skip: isId },
  "POST /api/v1/builds/[id]/kit": { schema: KitChoiceSchema, skip: isId },
  "POST /api/v1/builds/[id]/share-links": { schema: ShareLinkDaysSchema },
  "POST /api/v1/calc/size": { schema: FuelSystemInputSchema },
  "POST /api/v1/calc/blend": {
    schema: BlendRequestSchema,
    base: () => ({ kind: "mix", parts: [{ volumeL: 10, ethanolVolPct: 85 }] }),
  },
  "POST /api/v1/customers": { schema: CustomerCreateSchema },
  "PATCH /api/v1/customers/[id]": { schema: CustomerPatchSchema, skip: isId },
  "POST /api/v1/datalogs/[id]/analysis": { schema: DatalogAnalysisSchema, skip: isId },
  "POST /api/v1/parts": { schema: FlatPartSchema },
  "PATCH /api/v1/parts/[id]": { schema: PartUpdateSchema, skip: isId },
  "POST /api/v1/quotes": { schema: QuoteCreateSchema },
  "PATCH /api/v1/quotes/[id]": { schema: QuoteEditSchema, skip: isId },
  "POST /api/v1/quotes/[id]/status": { schema: QuoteStatusSchema, skip: isId },
  "POST /api/v1/quotes/[id]/respond": { schema: QuoteResponseSchema, skip: isId },
  "PATCH /api/v1/shop/settings": { schema: ShopSettingsPatchSchema },
  "PUT /api/v1/shop/notices": { schema: NoticeOptSchema },
  "POST /api/v1/suppliers": { schema: SupplierCreateSchema },
  "PATCH /api/v1/suppliers/[id]": { schema: SupplierUpdateSchema, skip: isId },
  "POST /api/v1/purchase-orders": { schema: PurchaseOrderCreateSchema },
  "POST /api/v1/purchase-orders/[id]/receive": { schema: PurchaseOrderReceiveSchema, skip: isId },
  "POST /api/v1/purchase-orders/[id]/cancel": { schema: PurchaseOrderCancelSchema, skip: isId },
  "POST /api/v1/jobs": { schema: JobOpenSchema },
  "POST /api/v1/jobs/[id]/fit": { schema: JobFitSchema, skip: isId },
  "POST /api/v1/invoices": { schema: InvoiceCreateSchema },
  "PATCH /api/v1/invoices/[id]": { schema: InvoiceEditSchema, skip: isId },
  "POST /api/v1/invoices/[id]/issue": { schema: InvoiceIssueSchema, skip: isId },
  "POST /api/v1/invoices/[id]/credit-notes": { schema: CreditNoteCreateSchema, skip: isId },
  "PATCH /api/v1/builds/[id]/tune": {
    schema: TuneLimitsSaveSchema.omit({ buildId: true }),
    base: () => ({ limits: null }),
  },
  "POST /api/v1/builds/[id]/next-step": { schema: NextPowerStepSchema.omit({ buildId: true }) },
  "PATCH /api/v1/tune-pulls/[id]": { schema: TunePullUpdateSchema, skip: isId },
  // better-auth's own endpoint: its body as the reset form sends it.
  "POST /api/auth/[...all]": {
    schema: z.object({ email: z.email().max(200), redirectTo: z.string().max(200) }),
  },
  // The webhook's body is judged by its signature first: any body without one is a 400.
  "POST /api/webhooks/payments": { schema: z.object({ id: z.string(), type: z.string() }) },
};
/** Routes that read a query string through a schema. */
const QUERY: Record<
  string,
  { schema: z.ZodType; base?: Record<string, string>; skip?: (p: Path) => boolean }
> = {
  "GET /api/v1/builds": { schema: BuildListQuery },
  "GET /api/v1/customers": { schema: CustomerListQuery },
  "GET /api/v1/parts": { schema: PartListQuery },
  "GET /api/v1/quotes": { schema: QuoteListQuery },
  "GET /api/v1/builds/[id]/spec-sheet": { schema: SpecSheetQuery },
  "GET /api/v1/invoices/[id]/payment": {
    schema: BalanceReturnSchema,
    base: { session: "cs_fuzz_session" },
    skip: isId,
  },
  "GET /api/v1/builds/[id]/tune": { schema: TuneSessionQuery },
  "GET /api/v1/quotes/[id]/deposit": {
    schema: DepositReturnSchema,
    base: { session: "cs_fuzz_session" },
    skip: isId,
  },
};
/** Uploads: their bodies are made here (a CSV from the part schema, a datalog, image bytes). */
const UPLOADS = [
  "POST /api/v1/parts/import",
  "POST /api/v1/builds/[id]/datalogs",
  "POST /api/v1/builds/[id]/tune/pulls",
  "PUT /api/v1/shop/logo",
];

/** Valid bodies for the actions whose access-matrix call is not one (their refusal is the point there). */
const ACTION_BASES: Record<string, () => unknown> = {
  "app/(auth)/actions.ts#signUpAction": () => ({
    name: "Fuzz Owner",
    shopName: "Fuzz shop",
    email: `fuzz-${Date.now().toString(36)}@example.test`,
    password: "fuzz-password-1",
  }),
  "app/(auth)/actions.ts#acceptInvitationAction": () => ({
    invitationId: "00000000-0000-4000-8000-00000000abcd",
    name: "Fuzz Person",
    password: "fuzz-password-1",
  }),
};

/** What each server action parses with. */
const ACTION_SCHEMAS: Record<string, z.ZodType> = {
  "app/(shop)/builds/new/actions.ts#createBuildAction": BuildCreateSchema.omit({ inputs: true }),
  "app/(shop)/builds/new/actions.ts#createDraftBuildAction": BuildDraftFormSchema,
  "lib/builds/build-actions.ts#saveBuildAction": BuildSaveSchema,
  "lib/builds/build-actions.ts#copyBuildAction": BuildRefSchema,
  "lib/builds/build-actions.ts#chooseKitAction": KitChoiceSchema,
  "app/(shop)/builds/[id]/revisions/[version]/actions.ts#restoreRevisionAction":
    RevisionRestoreSchema,
  "lib/dyno/dyno-actions.ts#analyseDatalogAction": DatalogAnalysisSchema,
  "lib/dyno/dyno-actions.ts#verifyDatalogAction": DatalogRefSchema,
  "lib/tune/tune-actions.ts#updateTunePullAction": TunePullUpdateSchema,
  "lib/tune/tune-actions.ts#deleteTunePullAction": TunePullRefSchema,
  "lib/tune/tune-actions.ts#saveTuneLimitsAction": TuneLimitsSaveSchema,
  "lib/tune/tune-actions.ts#nextPowerStepAction": NextPowerStepSchema,
  "app/(shop)/customers/actions.ts#createCustomerAction": CustomerSchema,
  "app/(shop)/customers/actions.ts#updateCustomerAction": CustomerUpdateSchema,
  "app/(shop)/customers/actions.ts#deleteCustomerAction": CustomerIdSchema,
  "app/(shop)/customers/actions.ts#invitePortalAction": CustomerIdSchema,
  "app/(shop)/customers/actions.ts#addVehicleAction": VehicleAddSchema,
  "app/(shop)/customers/actions.ts#updateVehicleAction": VehicleUpdateSchema,
  "app/(shop)/customers/actions.ts#deleteVehicleAction": VehicleIdSchema,
  "lib/parts/part-actions.ts#createPartAction": FlatPartSchema,
  "lib/parts/part-actions.ts#updatePartAction": PartUpdateSchema,
  "lib/parts/part-actions.ts#deletePartAction": PartIdSchema,
  "app/(shop)/settings/actions.ts#updateSettingsAction": ShopSettingsSchema,
  "app/(shop)/settings/actions.ts#inviteMemberAction": InviteSchema,
  "app/(shop)/settings/actions.ts#changeRoleAction": MemberRoleSchema,
  "app/(shop)/settings/actions.ts#removeMemberAction": MemberRemoveSchema,
  "lib/quotes/quote-actions.ts#createQuoteAction": QuoteCreateSchema,
  "lib/quotes/quote-actions.ts#editQuoteAction": QuoteEditSchema,
  "lib/quotes/quote-actions.ts#changeQuoteStatusAction": QuoteStatusSchema,
  "lib/quotes/quote-actions.ts#sendQuoteAction": QuoteIdSchema,
  "lib/quotes/quote-actions.ts#reviseQuoteAction": QuoteIdSchema,
  "lib/quotes/quote-actions.ts#respondToQuoteAction": QuoteResponseSchema,
  "lib/quotes/quote-actions.ts#startDepositAction": QuoteIdSchema,
  "lib/jobs/job-actions.ts#openJobAction": JobOpenSchema,
  "lib/jobs/job-actions.ts#fitJobAction": JobFitSchema,
  "lib/invoices/invoice-actions.ts#createInvoiceAction": InvoiceCreateSchema,
  "lib/invoices/invoice-actions.ts#editInvoiceAction": InvoiceEditSchema,
  "lib/invoices/invoice-actions.ts#issueInvoiceAction": InvoiceIssueSchema,
  "lib/invoices/invoice-actions.ts#createCreditNoteAction": CreditNoteCreateSchema,
  "lib/invoices/invoice-actions.ts#startBalanceAction": IdSchema,
  "lib/purchasing/purchasing-actions.ts#createSupplierAction": SupplierCreateSchema,
  "lib/purchasing/purchasing-actions.ts#updateSupplierAction": SupplierUpdateSchema,
  "lib/purchasing/purchasing-actions.ts#cancelPurchaseOrderAction": PurchaseOrderCancelSchema,
  "lib/purchasing/purchasing-actions.ts#createPurchaseOrderAction": PurchaseOrderCreateSchema,
  "lib/purchasing/purchasing-actions.ts#sendPurchaseOrderAction": IdSchema,
  "lib/purchasing/purchasing-actions.ts#receivePurchaseOrderAction": PurchaseOrderReceiveSchema,
  "lib/notices/notice-actions.ts#retryNoticeAction": MailRetrySchema,
  "lib/notices/notice-actions.ts#setShopNoticesAction": NoticeOptSchema,
  "lib/preferences/preference-actions.ts#setUnitsAction": UnitsSchema,
  "lib/shares/share-actions.ts#createShareLinkAction": ShareLinkCreateSchema,
  "lib/shares/share-actions.ts#revokeShareLinkAction": ShareLinkRevokeSchema,
  "app/(auth)/actions.ts#signUpAction": SignUpSchema,
  "app/(auth)/actions.ts#acceptInvitationAction": AcceptInvitationSchema,
  // Takes the invitation's id itself as its one argument.
  "app/(auth)/actions.ts#acceptAsSignedInAction": z.object({
    invitationId: z.string().min(1).max(100),
  }),
};

// ── Judging ───────────────────────────────────────────────────────────────────────────────────
/** A stack frame or a source path: never in an answer. */
const STACK =
  /\n\s+at\s+\S.*[:(]\d+:\d+\)?|node_modules\/|\/work\/|webpack-internal:|\.next(?:-test)?\/server/;
const failures: string[] = [];
const fieldFindings: string[] = [];
const pathOf = (p: Path) => p.map(String).join(".");
/** An issue names the field when its path is the field's, or leads to it, or goes on from it. */
const names = (issuePath: string, field: Field) =>
  issuePath === field.path ||
  field.path.startsWith(`${issuePath}.`) ||
  issuePath.startsWith(`${field.path}.`) ||
  issuePath === "(body)" ||
  issuePath === "form" ||
  field.excused.some((e) => issuePath === e || issuePath.startsWith(`${e}.`));

/**
 * The field a case changed, and the paths a refusal may name instead: what the valid body
 * itself is refused for (a command's rule about the fixture), and the objects the case had to
 * make up on the way to its field (their other fields are samples).
 */
interface Field {
  path: string;
  excused: string[];
}
function fieldOf(base: unknown, path: Path, baseIssues: string[]): Field {
  const excused = [...baseIssues];
  for (let i = 1; i < path.length; i++)
    if (getAt(base, path.slice(0, i)) === undefined) {
      excused.push(pathOf(path.slice(0, i)));
      break;
    }
  return { path: pathOf(path), excused };
}
/** The field paths a refusal names (a route's issues or an action's field errors). */
const refusedAt = (res: { json?: any; state?: any }): string[] =>
  res.json?.error?.issues?.map((i: { path: string }) => i.path) ??
  Object.keys(res.state?.fieldErrors ?? {});

function fail(label: string, why: string) {
  failures.push(`${label}: ${why}`);
}

/** A read may not be refused for its input yet change rows; its hashes are taken before the next write. */
let stale = false;
const readsOnly = (label: string) => label.startsWith("GET ");

/** Before a write: fresh hashes if reads came since the last ones. */
async function beforeWrite() {
  if (stale) hashes = await tableHashes(tables);
  stale = false;
}

/** After a request: a refused write changed nothing; the hashes move on to what is now stored. */
async function settle(label: string, refused: boolean) {
  if (readsOnly(label)) stale = true;
  else if (refused) await checkUnchanged(label);
  else hashes = await tableHashes(tables);
}

async function checkUnchanged(label: string) {
  const after = await tableHashes(tables);
  const changed = changedTables(hashes, after);
  if (changed.length) fail(label, `refused, yet changed ${changed.join(", ")}`);
  hashes = after;
}

async function judgeRoute(
  label: string,
  res: { status: number; text: string; json: any; headers: Headers },
  field?: Field,
  own: "ours" | "auth library" | "page" = "ours",
) {
  if (res.status >= 500) fail(label, `answered ${res.status}: ${res.text.slice(0, 300)}`);
  if (STACK.test(res.text))
    fail(label, `a stack trace or source path in the body: ${res.text.slice(0, 300)}`);
  const html = /text\/html/.test(res.headers.get("content-type") ?? "");
  // better-auth answers in its own shape; a link in page space may answer a page.
  if (own === "auth library" || (own === "page" && html)) {
    await settle(label, res.status >= 400 && res.status < 500);
    return;
  }
  if (res.status >= 400 && res.status < 500) {
    const err = res.json?.error;
    if (!/application\/json/.test(res.headers.get("content-type") ?? ""))
      fail(label, `a ${res.status} that is not JSON: ${res.text.slice(0, 200)}`);
    else if (
      typeof err?.code !== "string" ||
      typeof err?.message !== "string" ||
      !Array.isArray(err?.issues)
    )
      fail(
        label,
        `a ${res.status} without { error: { code, message, issues } }: ${res.text.slice(0, 200)}`,
      );
    else if (res.status === 422 && err.code === "invalid_input") {
      const paths = (err.issues as { path: unknown }[]).map((i) => i.path);
      if (!paths.length || paths.some((p) => typeof p !== "string" || !p))
        fail(label, `a 422 without field paths: ${res.text.slice(0, 200)}`);
      else if (field && !paths.some((p) => names(p as string, field)))
        fieldFindings.push(`${label}: issues at ${paths.join(", ")}`);
    }
  }
  await settle(label, res.status >= 400 && res.status < 500);
}

async function judgeAction(label: string, r: ActionResult, field?: Field) {
  if (r.http === 0) return; // React's encoder refuses it: a browser could not send it either
  if (r.http >= 500) fail(label, `answered ${r.http}: ${r.text.slice(0, 300)}`);
  if (/^[0-9a-f]+:E\{/m.test(r.text))
    fail(label, `a server error in the action's answer: ${r.text.slice(0, 300)}`);
  if (STACK.test(r.text))
    fail(label, `a stack trace or source path in the answer: ${r.text.slice(0, 300)}`);
  const state = r.state as {
    ok: boolean;
    status?: number;
    code?: string;
    fieldErrors?: Record<string, string[]>;
  } | null;
  if (state && !state.ok && (state.status ?? 0) >= 500)
    fail(label, `refused as ${state.status}: ${JSON.stringify(state).slice(0, 300)}`);
  const refused = r.http >= 400 || Boolean(state && !state.ok && !r.redirect);
  if (state && !state.ok && state.status === 422 && state.code === "invalid_input") {
    const keys = Object.keys(state.fieldErrors ?? {});
    if (!keys.length)
      fail(label, `a 422 without field errors: ${JSON.stringify(state).slice(0, 200)}`);
    else if (field && !keys.some((k) => names(k, field)))
      fieldFindings.push(`${label}: field errors at ${keys.join(", ")}`);
  }
  await settle(label, refused);
}

const show = (v: unknown) => {
  const s = typeof v === "string" ? JSON.stringify(v) : (JSON.stringify(v) ?? String(v));
  return s.length > 60 ? `${s.slice(0, 57)}…(${s.length})` : s;
};
const caseLabel = (key: string, c: Case) =>
  c.path.length ? `${key} ${pathOf(c.path)}=${show(c.value)} [${c.label}]` : `${key} [${c.label}]`;

// ── The runs ──────────────────────────────────────────────────────────────────────────────────
describe("schema-driven fuzz", () => {
  beforeEach(() => {
    failures.length = 0;
  });
  it("lists a schema or a body maker for every route and action of the surface", () => {
    const covered = new Set([...Object.keys(BODY), ...Object.keys(QUERY), ...UPLOADS]);
    const idOnly = Object.keys(ROUTES).filter((k) => k.includes("[") && !covered.has(k));
    const plain = Object.keys(ROUTES).filter((k) => !k.includes("[") && !covered.has(k));
    // The rest take no input but their path's id (fuzzed below) or nothing (their query is).
    for (const k of [...idOnly, ...plain]) expect(k).toMatch(/^(GET|POST|DELETE) /);
    expect(
      Object.keys(ACTIONS).filter((k) => !(k in ACTION_SCHEMAS)),
      "actions without a schema",
    ).toEqual([]);
  });

  it("JSON bodies: every field of each route's schema at and past its edges", async () => {
    const r = rng(SEED);
    for (const [key, spec] of Object.entries(BODY)) {
      const [method] = key.split(" ") as [string];
      const call = ROUTES[key]!.call(fx);
      const base = spec.base?.(fx) ?? call.body;
      const auth = key.includes("/api/auth/");
      const own = auth ? "auth library" : "ours";
      // better-auth's endpoint is asked signed out, each time from another address (its limit).
      const send = async (body: unknown) => {
        await beforeWrite();
        return request(auth ? null : owner, method, call.path, JSON.stringify(body) ?? "null", {
          "content-type": "application/json",
        });
      };
      const first = await send(base);
      await judgeRoute(`${key} (the valid body)`, first, undefined, own);
      const baseIssues = first.status === 422 ? refusedAt(first) : [];
      for (const c of [
        ...sweepsFor(spec.schema, base, r),
        ...casesFor(spec.schema, base, PER, r, spec.skip),
      ]) {
        const res = await send(bodyOf(spec.schema, base, c, r));
        const field = c.path.length ? fieldOf(base, c.path, baseIssues) : undefined;
        await judgeRoute(caseLabel(key, c), res, field, own);
      }
    }
    expect(failures).toEqual([]);
  }, 240_000);

  it("query strings: each list's and reader's schema at and past its edges", async () => {
    const r = rng(SEED + 1);
    const run = async (
      key: string,
      path: string,
      params: Record<string, string>,
      label: string,
      field?: Field,
    ) => {
      // Longer than an address can be (the server's header limit answers 431 before the app).
      if (Object.values(params).some((v) => v.length > 4000)) return;
      const u = new URL(path, BASE_URL);
      for (const [k, v] of Object.entries(params)) u.searchParams.set(k, v);
      const res = await request(
        key.includes("/api/auth/") ? null : owner,
        "GET",
        u.pathname + u.search,
      );
      await judgeRoute(
        `${key} ?${label}`,
        res,
        field,
        key.includes("/api/auth/")
          ? "auth library"
          : key.startsWith("GET /share/")
            ? "page"
            : "ours",
      );
    };
    for (const [key, spec] of Object.entries(QUERY)) {
      const { path } = ROUTES[key]!.call(fx);
      for (const c of casesFor(spec.schema, spec.base ?? {}, PER, r, spec.skip)) {
        if (c.value !== null && typeof c.value === "object") continue; // a query string holds text
        const params = { ...spec.base, [pathOf(c.path)]: String(c.value) };
        await run(
          key,
          path,
          params,
          `${pathOf(c.path)}=${show(c.value)} [${c.label}]`,
          fieldOf(spec.base ?? {}, c.path, []),
        );
      }
    }
    // The build list's cursor holds a sort key; one naming an instant no database can hold starts over.
    for (const d of DATE_TEXT) {
      const cursor = Buffer.from(JSON.stringify([d, NIL_UUID])).toString("base64url");
      await run(
        "GET /api/v1/builds",
        "/api/v1/builds",
        { cursor, sort: "updated" },
        `cursor of ${d}`,
      );
    }
    // Routes with no query schema: any parameter is ignored, or refused when it carries control characters.
    for (const key of Object.keys(ROUTES).filter((k) => k.startsWith("GET ") && !(k in QUERY))) {
      const { path } = ROUTES[key]!.call(fx);
      for (const c of casesFor(z.object({ x: z.string() }), {}, 4, r))
        await run(key, path, { x: String(c.value) }, `x=${show(c.value)} [${c.label}]`);
    }
    expect(failures).toEqual([]);
  }, 240_000);

  it("ids in paths: unknown, nil, max, upper-case, malformed and broken escapes", async () => {
    const r = rng(SEED + 2);
    const ids = [
      r.uuid(),
      NIL_UUID,
      MAX_UUID,
      `not-a-uuid-${"x".repeat(3000)}`,
      encodeURIComponent("😀\u202e"),
      "%zz",
      "%E0%A4%A",
      "%00",
    ];
    for (const [key, cell] of Object.entries(ROUTES)) {
      if (!key.includes("/[") || key.includes("[...")) continue; // a catch-all holds no id
      const [method] = key.split(" ") as [string];
      const { path, body, raw } = cell.call(fx);
      const own = [
        fx.build,
        fx.customer,
        fx.doomedCustomer,
        fx.part,
        fx.doomedPart,
        fx.quote,
        fx.datalog,
        fx.share,
      ].find((id) => path.includes(id));
      const variants = own
        ? [...ids, own.toUpperCase()].map((id) => path.replace(own, id))
        : ids.map((id) => path.replace(/\/share\/[^/]+/, `/share/${id}`));
      for (const p of variants) {
        if (method !== "GET") await beforeWrite();
        const res = raw
          ? await request(owner, method, p, raw.body as string, { "content-type": raw.type })
          : await request(owner, method, p, body);
        await judgeRoute(
          `${key} at ${p.slice(0, 100)}`,
          res,
          undefined,
          key.includes("/share/") ? "page" : "ours",
        );
      }
    }
    expect(failures).toEqual([]);
  }, 240_000);

  it("uploads: a catalog CSV made from the part schema's edges, datalogs and logos at their limits", async () => {
    const r = rng(SEED + 3);
    const baseRow = {
      sku: "FZ-BASE",
      category: "fitting",
      brand: "Fuzzware",
      name: "Fuzz part",
      price: "1.00",
      stock: "1",
    };
    const cases = [
      ...sweepsFor(PartFieldsSchema, baseRow, r),
      ...casesFor(PartFieldsSchema, baseRow, PER * 3, r),
    ];
    for (const [i, c] of cases.entries()) {
      const sweep = c.path.length === 0;
      if (!sweep && c.value !== null && typeof c.value === "object") continue;
      const row: Record<string, string> = sweep
        ? { ...(c.value as Record<string, string>) }
        : { ...baseRow, sku: `FZ-${SEED}-${i}` };
      if (!sweep) row[pathOf(c.path)] = String(c.value ?? "");
      await beforeWrite();
      const csv = Papa.unparse({
        fields: [...CSV_COLUMNS],
        data: [CSV_COLUMNS.map((k) => row[k] ?? "")],
      });
      const res = await request(
        owner,
        "POST",
        `/api/v1/parts/import${i % 2 ? "" : "?dryRun=1"}`,
        csv,
        {
          "content-type": "text/csv",
        },
      );
      await judgeRoute(caseLabel("POST /api/v1/parts/import (a row)", c), res, undefined);
    }
    const datalogs: [string, string][] = [
      ["emoji and right-to-left headers", "rpm,duty 😀,\u202eλ\n3000,40,0.8\n3100,41,0.81\n"],
      [
        "numbers past every limit",
        "rpm,duty\n1e309,-1e309\n1.7976931348623157e308,NaN\n-0,5e-324\n",
      ],
      [
        "2000 columns",
        `${Array.from({ length: 2000 }, (_, i) => `c${i}`).join(",")}\n${"1,".repeat(1999)}1\n`,
      ],
      ["duplicate headers", "rpm,rpm,duty,duty\n3000,3000,40,40\n"],
      ["a byte order mark and CRLF", "\ufeffrpm,duty\r\n3000,40\r\n"],
      ["a header only", "rpm,duty\n"],
      ["a lone surrogate", "rpm,duty\ud800\n3000,40\n"],
      ["NUL", "rpm,duty\n3000,\u000040\n"],
      ["longest line", `rpm,duty\n3000,${"9".repeat(200_000)}\n`],
    ];
    for (const [label, csv] of datalogs) {
      await beforeWrite();
      const res = await request(owner, "POST", `/api/v1/builds/${fx.build}/datalogs`, csv, {
        "content-type": "text/csv",
        "x-file-name": `${"x".repeat(300)}.csv`,
      });
      await judgeRoute(`POST datalogs (${label})`, res);
      await beforeWrite();
      const pull = await request(
        owner,
        "POST",
        `/api/v1/builds/${fx.build}/tune/pulls?ethanolPct=85&powerMeasuredAt=wheel`,
        csv,
        { "content-type": "text/csv", "x-file-name": `${"x".repeat(300)}.csv` },
      );
      await judgeRoute(`POST tune pull (${label})`, pull);
    }
    // The pull's fields come in the query string: at and past their edges, and hostile text.
    const pullQueries = [
      "ethanolPct=100.0001&powerMeasuredAt=crank",
      "ethanolPct=-0&powerMeasuredAt=hub&boostTargetKpa=500",
      "ethanolPct=85&powerMeasuredAt=wheel&boostTargetKpa=500.1",
      `ethanolPct=85&powerMeasuredAt=crank&notes=${"n".repeat(2001)}`,
      "ethanolPct=85&powerMeasuredAt=crank&notes=%F0%9F%98%80%E2%80%AE",
      "ethanolPct=85&powerMeasuredAt=crank&mapping=%7Bnot%20json",
      `ethanolPct=85&powerMeasuredAt=crank&mapping=${encodeURIComponent(JSON.stringify({ rpm: "rpm", duty: { column: "duty", kind: "duty_pct" }, egt: { columns: Array(17).fill("rpm"), unit: "C" } }))}`,
      "ethanolPct=1e309&powerMeasuredAt=crank",
      "powerMeasuredAt=crank",
    ];
    for (const q of pullQueries) {
      await beforeWrite();
      const res = await request(
        owner,
        "POST",
        `/api/v1/builds/${fx.build}/tune/pulls?${q}`,
        "rpm,duty\n3000,40\n3100,41\n",
        { "content-type": "text/csv" },
      );
      await judgeRoute(`POST tune pull (?${q.slice(0, 60)})`, res);
    }
    const logos: [string, Buffer][] = [
      ["15 px: one too small", solidPng(15, 15, [1, 2, 3])],
      ["4001 px: one too wide", solidPng(4001, 16, [1, 2, 3])],
      ["16 px: the smallest", solidPng(16, 16, [1, 2, 3])],
      ["1 MB and a byte", Buffer.concat([solidPng(16, 16, [1, 2, 3]), Buffer.alloc(1024 * 1024)])],
    ];
    for (const [label, bytes] of logos) {
      await beforeWrite();
      const res = await fetch(`${BASE_URL}/api/v1/shop/logo`, {
        method: "PUT",
        body: new Uint8Array(bytes),
        headers: {
          cookie: owner.cookie,
          "x-forwarded-for": owner.ip,
          origin: BASE_URL,
          "content-type": "image/png",
        },
      });
      const text = await res.text();
      let json: unknown;
      try {
        json = JSON.parse(text);
      } catch {
        json = undefined;
      }
      await judgeRoute(`PUT logo (${label})`, {
        status: res.status,
        text,
        json,
        headers: res.headers,
      });
    }
    expect(failures).toEqual([]);
  }, 240_000);

  it("server actions: every field of each action's schema at and past its edges", async () => {
    const r = rng(SEED + 4);
    const manifest = actionManifest();
    for (const [key, cell] of Object.entries(ACTIONS)) {
      const [file, name] = key.split("#") as [string, string];
      const found = manifest.find((m) => m.file === file && m.name === name);
      expect(found, `${key} is in the build's action manifest`).toBeTruthy();
      const ref = { ...found!, page: cell.page(fx) };
      const schema = ACTION_SCHEMAS[key]!;
      const args = cell.args(fx);
      const single = args.length === 1; // acceptAsSignedInAction(invitationId)
      const form = args[1] instanceof FormData;
      const base =
        ACTION_BASES[key]?.() ??
        (single
          ? { invitationId: args[0] }
          : form
            ? Object.fromEntries((args[1] as FormData).entries())
            : args[1]);
      const argsOf = (value: Record<string, unknown>): unknown[] | null => {
        if (single) return [value?.invitationId];
        if (!form) return [args[0], value];
        const fields: Record<string, string> = {};
        for (const [k, v] of Object.entries(value ?? {})) {
          if (v !== null && typeof v === "object") return null; // a form holds text
          if (v !== undefined && v !== null) fields[k] = String(v);
        }
        return [args[0], formOf(fields)];
      };
      await beforeWrite();
      const first = await callAction(owner, ref, argsOf(base as Record<string, unknown>)!);
      await judgeAction(`${key} (the valid arguments)`, first);
      const baseIssues = first.state?.ok === false ? refusedAt({ state: first.state }) : [];
      for (const c of [...sweepsFor(schema, base, r), ...casesFor(schema, base, PER, r)]) {
        const value = bodyOf(schema, base, c, r) as Record<string, unknown>;
        const sent = argsOf(value);
        if (!sent) continue;
        await beforeWrite();
        await judgeAction(
          caseLabel(key, c),
          await callAction(owner, ref, sent),
          c.path.length ? fieldOf(base, c.path, baseIssues) : undefined,
        );
      }
    }
    // The demo shop's own settings again (its name and rates are what other suites expect).
    const settings = manifest.find((m) => m.name === "updateSettingsAction")!;
    await callAction(owner, { ...settings, page: "/settings" }, [
      { ok: false },
      formOf(SEED_SETTINGS_FORM),
    ]);
    expect(failures).toEqual([]);
  }, 240_000);

  it("reports refusals whose field errors do not name the field that was wrong", () => {
    // A rule across fields (caution below danger, a build or a customer) may name another field;
    // anything else must name the one that was changed.
    expect(fieldFindings).toEqual([]);
  });
});
