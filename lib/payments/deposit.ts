import { mulDivRound } from "@/lib/catalog/money";

/** The deposit on a total: the shop's share in basis points, rounded half-up to the cent. */
export function depositOf(totalMinor: number, depositBp: number): number {
  return mulDivRound(totalMinor, depositBp, 10_000);
}
