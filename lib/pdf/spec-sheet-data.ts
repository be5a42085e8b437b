import "server-only";

import { getBuild, getRevision } from "@/db/queries/builds";
import { latestVerifiedDatalog } from "@/db/queries/datalogs";
import { pdfLogo } from "@/db/queries/logos";
import { unitSystemOf, userName } from "@/db/queries/preferences";
import { getShopSettings } from "@/db/queries/shops";
import { storedEffectiveInputs } from "@/lib/builds/stored-inputs";
import { CALC_VERSION, sizeParsedFuelSystem } from "@/lib/calc";
import { NotFound } from "@/lib/domain/errors";
import { sheetSession } from "@/lib/tune/tune-session";

import type { SpecSheetData } from "./spec-sheet";

/** Everything a spec sheet prints, from a saved revision (the latest unless `version` is given). */
export async function specSheetData(
  shopId: string,
  buildId: string,
  opts: { version?: number; portalUserId?: string; viewerId?: string },
): Promise<SpecSheetData> {
  const row = await getBuild(shopId, buildId, opts.portalUserId);
  if (!row) throw new NotFound("That build");
  const rev = await getRevision(shopId, buildId, opts.version ?? row.build.version);
  if (!rev) throw new NotFound(`Version ${opts.version} of that build`);
  // The revision's own inputs with the shop settings it was sized with: its figures never move.
  const input = storedEffectiveInputs(rev);
  const [settings, logo, log, tune] = await Promise.all([
    getShopSettings(shopId),
    pdfLogo(shopId),
    rev.status === "verified" ? latestVerifiedDatalog(shopId, buildId) : null,
    sheetSession(shopId, buildId, input),
  ]);
  const stored = rev.result;
  const result = stored && rev.calcVersion === CALC_VERSION ? stored : sizeParsedFuelSystem(input);
  // Staff and customers in the portal read their own units where they set them, else the
  // shop's; a share link (no one signed in) the shop's.
  const reader = opts.portalUserId ?? opts.viewerId;
  const units = reader
    ? await unitSystemOf(reader, shopId)
    : (settings?.settings.units ?? "metric");
  return {
    shop: {
      name: settings?.name ?? "",
      address: settings?.settings.address ?? null,
      phone: settings?.settings.phone ?? null,
      logo,
    },
    build: {
      title: row.build.title,
      vehicle: row.build.vehicle,
      customerName: row.customerName,
      version: rev.version,
      savedAt: rev.createdAt,
      tunerName: await userName(row.build.tunerId),
    },
    input,
    result,
    parts: rev.parts,
    units,
    paper: settings?.settings.paperSize ?? "a4",
    timeZone: settings?.settings.timeZone ?? "UTC",
    verification:
      log?.analysis && log.verifiedAt
        ? {
            fileName: log.fileName,
            verifiedAt: log.verifiedAt,
            analysis: log.analysis as NonNullable<SpecSheetData["verification"]>["analysis"],
          }
        : null,
    tune,
  };
}

export const pdfFileName = (title: string, version: number) =>
  `${
    title
      .replace(/[^\w.-]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60) || "build"
  }-v${version}.pdf`;

/** The PDF as a response: shown in the browser, never cached by shared caches. */
export const pdfResponse = (pdf: Buffer, fileName: string, extra: Record<string, string> = {}) =>
  new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `inline; filename="${fileName}"`,
      "cache-control": "private, no-store",
      ...extra,
    },
  });
