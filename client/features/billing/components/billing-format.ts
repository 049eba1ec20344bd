/** A price in the currency's smallest unit, as people read it (e.g. €49.00). */
export function formatMoney(amount: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 100);
}

/** A count with thousands grouped. */
export function formatCount(n: number): string {
  return n.toLocaleString('en-GB');
}

/** Share of a limit used, 0–100 (capped for drawing; the text shows the real numbers). */
export function usedShare(used: number, allowed: number): number {
  if (allowed <= 0) return 100;
  return Math.min(100, Math.round((used / allowed) * 1000) / 10);
}
