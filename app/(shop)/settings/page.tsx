import type { Metadata } from "next";
import { notFound } from "next/navigation";

import { NoticeToggle } from "@/components/operations/notice-toggle";
import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { logoFacts } from "@/db/queries/logos";
import { isNoticeSubscriber } from "@/db/queries/mail-log";
import { listMembers, listPendingInvitations } from "@/db/queries/members";
import { unitSystemOf } from "@/db/queries/preferences";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { ASPIRATION_CLASS_LABELS, formatNumber, formatValue, FUEL_CLASS_LABELS } from "@/lib/calc";
import type { UnitSystem } from "@/lib/calc/units";
import { minorToPlain } from "@/lib/catalog/money";
import { isRole, ROLE_LABELS } from "@/lib/domain/roles";
import { shopBsfc } from "@/lib/dyno/log-analysis";
import { countryOptions } from "@/lib/format/phone";
import {
  settingsFormValues,
  shopSettingsView,
  type ShopSettingsView,
} from "@/lib/shop/settings-view";
import { limitsInForce } from "@/lib/tune/limits";

import { LogoUpload } from "./logo-upload";
import { InviteForm, MemberRow } from "./members";
import { SettingsForm } from "./settings-form";
import { ShopTuneLimits } from "./tune-limits";

export const metadata: Metadata = { title: "Settings" };

/** The settings as the form's text fields hold them, in the viewer's units (blank: the library's). */
function formValues(v: ShopSettingsView, units: UnitSystem): Record<string, string> {
  const out = settingsFormValues(v, units);
  out.labourRate = minorToPlain(Math.round(v.labourRate * 100));
  return out;
}

export default async function SettingsPage() {
  const m = await requirePageMember("settings:read");
  const s = await getShopSettings(m.shopId);
  if (!s) notFound();
  const owner = can(m.role, "members:manage");
  const tune = limitsInForce({ build: null, shop: s.settings.tuneLimits });
  const [members, invitations, logo, measured, units, notices] = await Promise.all([
    listMembers(m.shopId),
    owner ? listPendingInvitations(m.shopId) : Promise.resolve([]),
    logoFacts(m.shopId),
    shopBsfc(m.shopId),
    unitSystemOf(m.user.id, m.shopId),
    isNoticeSubscriber(m.shopId, m.user.id),
  ]);
  return (
    <>
      <PageHeader title="Settings" />
      <section
        aria-labelledby="my-notices"
        className="mb-8 rounded-lg border border-ink-200 bg-white p-5"
      >
        <h2 id="my-notices" className="mb-2 text-xl font-semibold">
          My notices
        </h2>
        <NoticeToggle on={notices} />
      </section>
      <div className="grid gap-8 xl:grid-cols-[1fr_26rem]">
        <section
          aria-labelledby="shop-defaults"
          className="rounded-lg border border-ink-200 bg-white p-5"
        >
          <h2 id="shop-defaults" className="text-xl font-semibold">
            Shop defaults
          </h2>
          {!can(m.role, "settings:update") ? (
            <p className="mt-1 text-sm text-ink-600">Only the owner can change these.</p>
          ) : null}
          <SettingsForm
            readOnly={!can(m.role, "settings:update")}
            initial={formValues(shopSettingsView(s.name, s.settings), units)}
            units={units}
            countries={countryOptions()}
          />
          <LogoUpload
            logo={
              logo
                ? {
                    width: logo.width,
                    height: logo.height,
                    version: logo.sha256.slice(0, 12),
                    uploadedAt: logo.uploadedAt.toISOString(),
                  }
                : null
            }
            canEdit={can(m.role, "settings:update")}
          />
        </section>
        <section
          aria-labelledby="members"
          className="rounded-lg border border-ink-200 bg-white p-5"
        >
          <h2 id="members" className="text-xl font-semibold">
            Members
          </h2>
          <ul className="mt-4 divide-y divide-ink-100">
            {members.map((x) => (
              <MemberRow
                key={x.id}
                member={{
                  id: x.id,
                  name: x.name,
                  email: x.email,
                  role: isRole(x.role) ? x.role : "customer",
                }}
                editable={owner && x.userId !== m.user.id}
              />
            ))}
          </ul>
          {owner ? (
            <>
              <h3 className="mt-6 text-lg font-semibold">Invite someone</h3>
              <InviteForm />
              <h3 className="mt-6 text-lg font-semibold">Pending invitations</h3>
              {invitations.length === 0 ? (
                <p className="mt-2 text-sm text-ink-600">None.</p>
              ) : (
                <ul className="mt-2 space-y-1 text-sm" aria-label="Pending invitations">
                  {invitations.map((i) => (
                    <li key={i.id}>
                      {i.email} — {isRole(i.role) ? ROLE_LABELS[i.role] : i.role}, until{" "}
                      <LocalTime value={i.expiresAt} kind="date" />
                    </li>
                  ))}
                </ul>
              )}
            </>
          ) : null}
        </section>
      </div>
      <section
        aria-labelledby="tune-limits"
        className="mt-8 rounded-lg border border-ink-200 bg-white p-5"
      >
        <h2 id="tune-limits" className="text-xl font-semibold">
          Tune limits
        </h2>
        <p className="mt-1 text-sm text-ink-600">
          What every build&apos;s dyno pulls are judged against unless the build sets its own:
          lambda against boost, injector duty, exhaust gas temperature and its spread between
          cylinders, exhaust-to-boost pressure, turbo speed.{" "}
          {tune.baseSource === "shop"
            ? "These are the shop's own."
            : "These are Fuelwright's defaults until the owner saves the shop's."}{" "}
          {!can(m.role, "settings:update") ? "Only the owner can change these." : ""}
        </p>
        <ShopTuneLimits
          units={units}
          limits={tune.limits}
          sources={tune.sources}
          source={tune.baseSource}
          canWrite={can(m.role, "settings:update")}
        />
      </section>
      <section
        aria-labelledby="measured-bsfc"
        className="mt-8 rounded-lg border border-ink-200 bg-white p-5"
      >
        <h2 id="measured-bsfc" className="text-xl font-semibold">
          Measured BSFC from verified builds
        </h2>
        <p className="mt-1 text-sm text-ink-600">
          Each build verified with a dyno log that logged power adds its figure here. Build sheets
          offer these beside the rule-of-thumb defaults above.
        </p>
        {measured.length === 0 ? (
          <p className="mt-3 text-sm text-ink-600">
            Nothing measured yet: verify a build on the dyno with power in the log.
          </p>
        ) : (
          <table className="mt-3 w-full text-sm">
            <thead className="text-left text-ink-600">
              <tr>
                <th scope="col" className="py-1">
                  Fuel
                </th>
                <th scope="col">Aspiration</th>
                <th scope="col" className="text-right">
                  Builds
                </th>
                <th scope="col" className="text-right">
                  Mean
                </th>
                <th scope="col" className="text-right">
                  Range
                </th>
                <th scope="col" className="text-right">
                  Rule of thumb
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-100">
              {measured.map((r) => {
                const rule =
                  r.fuel === "gasoline"
                    ? r.aspiration === "na"
                      ? s.settings.bsfcGasolineNa
                      : s.settings.bsfcGasolineBoosted
                    : r.fuel === "e85"
                      ? r.aspiration === "na"
                        ? s.settings.bsfcE85Na
                        : s.settings.bsfcE85Boosted
                      : null;
                return (
                  <tr key={`${r.fuel}/${r.aspiration}`}>
                    <td className="py-1.5">{FUEL_CLASS_LABELS[r.fuel]}</td>
                    <td>{ASPIRATION_CLASS_LABELS[r.aspiration]}</td>
                    <td className="figure text-right">{r.builds}</td>
                    <td className="figure text-right font-semibold">
                      {formatValue("bsfc", r.meanGPerKwh, units)}
                    </td>
                    <td className="figure text-right">
                      {formatNumber("bsfc", r.minGPerKwh, units)}–
                      {formatValue("bsfc", r.maxGPerKwh, units)}
                    </td>
                    <td className="figure text-right text-ink-600">
                      {rule === null ? "blend of the two" : formatValue("bsfc", rule, units)}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </section>
    </>
  );
}
