import { chromium, type Browser, type BrowserContext } from "playwright-core";

export const BASE_URL = process.env.TEST_BASE_URL ?? "http://localhost:3100";

/** Debian's Chromium, headless, with the flags this closed network needs (Playwright gives it a fresh profile). */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

let ipCounter = Math.floor(Math.random() * 60000);
/** A context that looks like its own client to the sign-in rate limit. */
export async function newClient(
  browser: Browser,
  viewport = { width: 1280, height: 900 },
  /** The browser's own time zone (an IANA name); the machine's when left out. */
  timezoneId?: string,
): Promise<BrowserContext> {
  ipCounter++;
  return browser.newContext({
    baseURL: BASE_URL,
    viewport,
    ...(timezoneId ? { timezoneId } : {}),
    extraHTTPHeaders: {
      "x-forwarded-for": `172.${16 + (Math.floor(ipCounter / 62500) % 16)}.${Math.floor(ipCounter / 250) % 250}.${(ipCounter % 250) + 1}`,
    },
  });
}

/** Signs a demo member in through the form and waits for their landing page. */
export async function signInAs(
  page: import("playwright-core").Page,
  who: "owner" | "tuner" | "counter" | "customer",
  landing = who === "customer" ? "**/my" : "**/builds",
) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(`${who}@demo.fuelwright.test`);
  await page.getByLabel("Password").fill("fuelwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(landing);
}
