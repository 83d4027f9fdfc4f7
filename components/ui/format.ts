// How every screen writes an amount of money and a moment: one way, whatever the browser's defaults.

/** "1,234.50": two decimals, thousands grouped. */
export function money(x: number): string {
  return x.toLocaleString("en", { minimumFractionDigits: 2, maximumFractionDigits: 2 });
}

/** "2 Dec, 14:05", or "never" when there is no moment. */
export function when(iso: string | null): string {
  if (!iso) return "never";
  const d = new Date(iso);
  return d.toLocaleString("en", { day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" });
}
