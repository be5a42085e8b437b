/** Paths revalidated after writes, in one place. */
export const PATHS = {
  customers: "/customers",
  customer: (id: string) => `/customers/${id}`,
  parts: "/parts",
  part: (id: string) => `/parts/${id}`,
  settings: "/settings",
} as const;
