import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

/** A pull generated in the test: duty 40 → 80 % over 3000–7000 rpm, lambda 0.80, MAP in psi absolute. */
function pullCsv() {
  const rows = ["Engine RPM,Inj Duty,Lambda,MAP,Fuel Pressure,Power", "rpm,%,lambda,psi,psi,kW"];
  for (let i = 0; i <= 80; i++) {
    const map = 14.7 + 20 * Math.min(1, (i / 80) * 1.5);
    rows.push(
      `${3000 + i * 50},${(40 + (40 * i) / 80).toFixed(2)},0.80,${map.toFixed(2)},${(map - 14.7 + 43.5).toFixed(2)},${(150 + i * 2).toFixed(1)}`,
    );
  }
  return rows.join("\n") + "\n";
}

describe("dyno verification", () => {
  it("a tuner uploads a log, maps its columns, sees the pull and marks the build verified", async () => {
    // A fitted build to verify, made through the API from a demo build's inputs.
    const tag = Date.now().toString(36);
    const tuner = await signIn("tuner@demo.fuelwright.test");
    const [demo] =
      await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: demo!.customer_id,
      title: `Dyno E2E ${tag}`,
      inputs: demo!.inputs,
    });
    expect(made.status).toBe(201);
    const id = made.json.build.id;
    await sql`update builds set status = 'fitted' where id = ${id}`;

    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    page.on("dialog", (d) => void d.accept());
    await signInAs(page, "tuner");
    await page.goto(`/builds/${id}/dyno`);
    await page
      .getByLabel(/Upload a dyno log/)
      .setInputFiles({ name: "pull-1.csv", mimeType: "text/csv", buffer: Buffer.from(pullCsv()) });
    await expect
      .poll(() => page.getByText("pull-1.csv uploaded").count(), { timeout: 20000 })
      .toBe(1);
    // The first guess maps rpm, duty and lambda; the tuner sets the fuel pressure as rail, psi.
    await expect.poll(() => page.getByLabel("Engine speed (rpm)").inputValue()).toBe("Engine RPM");
    const fuel = page.getByRole("group", { name: "Fuel pressure" });
    await fuel.getByLabel("Column").selectOption("Fuel Pressure");
    await fuel.getByLabel("Unit").selectOption("psi");
    await page.getByRole("button", { name: "Analyse the pull" }).click();
    await expect
      .poll(() => page.getByText("80.0 % at 7000 rpm").count(), { timeout: 15000 })
      .toBe(1);
    await expect
      .poll(() => page.getByTestId("pull-chart").locator("path.recharts-curve").count())
      .toBeGreaterThan(3);
    await page.screenshot({ path: "test-results/screenshots/dyno.png", fullPage: true });
    await page.getByRole("button", { name: "Mark verified" }).click();
    await expect.poll(() => page.getByText("The build is verified with this log").count()).toBe(1);
    await expect
      .poll(async () => (await page.reload(), page.getByTestId("build-status").innerText()))
      .toBe("Verified");
    const [row] = await sql`select status from builds where id = ${id}`;
    expect(row!.status).toBe("verified");
    expect(
      (
        await sql`select count(*)::int as n from datalogs where build_id = ${id} and verified_at is not null`
      )[0]!.n,
    ).toBe(1);

    // The shop has learnt: the build sheet offers its measured BSFC beside the rule of thumb.
    const table = (await request(tuner, "GET", "/api/v1/shop/bsfc")).json.rows as {
      fuel: string;
      aspiration: string;
      builds: number;
      meanGPerKwh: number;
    }[];
    const learnt = table.find((r) => r.fuel === "e85" && r.aspiration === "boosted")!;
    expect(learnt.builds).toBeGreaterThanOrEqual(1);
    // This build's log logged power, so it is one of them.
    expect(
      (
        await sql`select (analysis -> 'measuredBsfc' ->> 'gPerKwh')::float8 as g from datalogs where build_id = ${id}`
      )[0]!.g,
    ).toBeGreaterThan(150);
    await page.goto(`/builds/${id}`);
    await page.getByRole("radio", { name: /Metric/ }).click();
    const offer = page.getByRole("button", {
      name: `Use this shop's measured BSFC (${learnt.builds} ${learnt.builds === 1 ? "build" : "builds"})`,
    });
    await offer.click();
    await expect
      .poll(() => page.getByLabel(/^BSFC \(blank/).inputValue())
      .toBe(String(Math.round(learnt.meanGPerKwh)));
    await expect.poll(() => page.getByText("✓ Using this shop's measured BSFC").count()).toBe(1);
    await ctx.close();
  });
});
