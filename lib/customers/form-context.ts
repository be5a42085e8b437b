import "server-only";

import { shopCountry } from "@/db/queries/customers";
import { countryName, taxIdLabel } from "@/lib/domain/countries";
import { countryOptions } from "@/lib/format/phone";

/** What the customer form needs of the shop: its country, the tax number's name, the countries. */
export async function customerFormContext(shopId: string) {
  const country = await shopCountry(shopId);
  return {
    shopCountry: country,
    shopCountryName: countryName(country),
    taxIdLabel: taxIdLabel(country),
    countries: countryOptions(),
  };
}
