/**
 * Builds-table benchmark on 100 000 builds over 10 000 customers (one shop). Times the same
 * query functions the route handlers call — GET /api/v1/builds (search, filters, pages) and
 * opening a build (the build plus its revisions) — and prints p50/p95 per case. No pass/fail.
 * Run: npm run bench:builds (starts its own database on port 54397).
 */
import postgres from "postgres";

import { getBuild, listBuilds, listRevisions } from "../../db/queries/builds";

const SHOP = "demo-shop-ridgeback";
const BUILDS = 100_000;
const CUSTOMERS = 10_000;
const sql = postgres(process.env.DATABASE_URL!, { onnotice: () => {} });

async function seed() {
  const [{ n }] =
    (await sql`select count(*)::int as n from builds where shop_id = ${SHOP}`) as unknown as [
      { n: number },
    ];
  if (n >= BUILDS) return console.log(`bench data present (${n} builds)`);
  const t0 = performance.now();
  // Invented names and vehicles, for volume only.
  await sql`
    insert into customers (shop_id, name, email)
    select ${SHOP}, 'Bench ' || (array['Aldana','Brisco','Corvin','Dunmore','Esquivel','Falkner','Gorski','Halloran','Ibarra','Jessup'])[1 + g % 10] || ' ' || g, 'bench' || g || '@example.test'
    from generate_series(1, ${CUSTOMERS}) g`;
  const [tpl] =
    await sql`select inputs, result, calc_version from builds where shop_id = ${SHOP} order by created_at limit 1`;
  await sql`
    with c as (select id, row_number() over (order by id) as rn from customers where shop_id = ${SHOP} and name like 'Bench %')
    insert into builds (shop_id, customer_id, title, vehicle, status, inputs, result, calc_version, tuner_id, created_by, updated_by, created_at, updated_at)
    select ${SHOP}, c.id,
      (array['Street','Track','Drag','Flex','Stage 2','Stage 3'])[1 + g % 6] || ' build ' || g,
      (array['Kestrel GT','Marlin 2.0T','Orca V8','Heron 1.8','Falcon RS','Vireo Turbo','Condor 5.0','Petrel 2.5'])[1 + g % 8] || ' ' || (1995 + g % 30),
      (array['draft','sized','quoted','ordered','fitted','verified'])[1 + g % 6],
      ${tpl!.inputs}::jsonb, ${tpl!.result}::jsonb, ${tpl!.calc_version},
      case when (g * 7919) % 13 < 7 then 'demo-user-tuner' else 'demo-user-owner' end, 'demo-user-tuner', 'demo-user-tuner',
      now() - (g || ' minutes')::interval, now() - (g || ' minutes')::interval
    from generate_series(1, ${BUILDS}) g join c on c.rn = 1 + g % ${CUSTOMERS}`;
  await sql`
    insert into build_revisions (shop_id, build_id, version, status, inputs, result, calc_version, author_id, created_at)
    select shop_id, id, 1, status, inputs, result, calc_version, created_by, created_at from builds where shop_id = ${SHOP} and title like '% build %'`;
  await sql`vacuum analyze`;
  console.log(
    `seeded ${BUILDS} builds over ${CUSTOMERS} customers in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
  );
}

const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
};

async function time(name: string, runs: number, fn: (i: number) => Promise<unknown>) {
  for (let i = 0; i < 20; i++) await fn(i); // warm-up
  const ms: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn(i);
    ms.push(performance.now() - t);
  }
  return {
    case: name,
    runs,
    "p50 ms": +quantile(ms, 0.5).toFixed(2),
    "p95 ms": +quantile(ms, 0.95).toFixed(2),
  };
}

await seed();
if (process.env.BENCH_SEED_ONLY) {
  await sql.end();
  process.exit(0);
}
const ids = (
  await sql`select id from builds where shop_id = ${SHOP} order by random() limit 500`
).map((r) => r.id as string);
const rareNames = Array.from(
  { length: 200 },
  (_, i) =>
    `${["aldana", "corvin", "gorski", "ibarra", "jessup"][i % 5]} ${((i * 47) % CUSTOMERS) + 1}`,
);
const page2 = (await listBuilds(SHOP, { limit: 25 })).nextCursor!;
const rows = [
  await time("list, no search (first page)", 300, () => listBuilds(SHOP, { limit: 25 })),
  await time("list, next page (cursor)", 300, () => listBuilds(SHOP, { limit: 25, cursor: page2 })),
  await time("q = a customer's name (few rows)", 300, (i) =>
    listBuilds(SHOP, { q: rareNames[i % rareNames.length], limit: 25 }),
  ),
  await time("q = vehicle word (1 in 8 rows)", 300, () =>
    listBuilds(SHOP, { q: "orca v8", limit: 25 }),
  ),
  await time("q = build number fragment", 300, (i) =>
    listBuilds(SHOP, { q: `build ${4000 + i}`, limit: 25 }),
  ),
  await time("q = no match", 300, () => listBuilds(SHOP, { q: "zzqx nothing", limit: 25 })),
  await time("status filter", 300, () => listBuilds(SHOP, { status: "fitted", limit: 25 })),
  await time("tuner filter + title sort", 300, () =>
    listBuilds(SHOP, { tunerId: "demo-user-owner", sort: "title", limit: 25 }),
  ),
  await time("open a build (build + revisions)", 500, (i) =>
    Promise.all([getBuild(SHOP, ids[i % ids.length]!), listRevisions(SHOP, ids[i % ids.length]!)]),
  ),
];
console.table(rows);
await sql.end();
process.exit(0);
