import { Signal } from "@/components/ui/status";

/** Available stock (on hand less held by accepted quotes) against the reorder level. */
export function StockBadge({
  stock,
  reserved,
  reorderLevel,
}: {
  stock: number;
  reserved: number;
  reorderLevel: number;
}) {
  const available = stock - reserved;
  if (available <= 0)
    return <Signal level="danger">{available < 0 ? `${-available} short` : "None free"}</Signal>;
  if (available <= reorderLevel) return <Signal level="caution">{available} · reorder</Signal>;
  return <Signal level="ok">{available} free</Signal>;
}
