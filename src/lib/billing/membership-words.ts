/** How a subscription status reads to people (UI and CSV); the provider's words stay in code. */
export const STATUS_LABEL: Record<string, string> = {
  none: 'No membership',
  incomplete: 'Checkout not finished',
  trialing: 'On trial',
  active: 'Active',
  past_due: 'Payment due',
  canceled: 'Cancelled',
  unpaid: 'Unpaid',
  incomplete_expired: 'Checkout expired',
  paused: 'Paused',
};

/** 1900 + "eur" -> "€19.00". */
export function formatMoney(minor: number, currency: string): string {
  return new Intl.NumberFormat('en-IE', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);
}

/** "19", "19.5", "19,50" -> 1950 cents; null when it is not an amount. */
export function parseMoney(text: string): number | null {
  const m = /^\s*(\d{1,6})(?:[.,](\d{1,2}))?\s*$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? '0').padEnd(2, '0'));
}
