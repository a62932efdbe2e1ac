export function formatDate(iso: string, timeZone?: string): string {
  return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeZone }).format(new Date(iso));
}

export function formatDateTime(iso: string, timeZone?: string): string {
  return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(iso));
}

/** A count (credits, players) with the reader's digit grouping, so 12345 reads as 12,345. */
export const formatCount = (n: number) => new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 }).format(n);

/** How many decimals a currency's minor unit has (ISO 4217: CAD 2, JPY 0), as the platform's Intl knows it. */
export const minorDigits = (currency: string) => new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;

/** Integer minor units (1250) shown as money in the rink's currency ($12.50). */
export function formatMoney(minor: number, currency: string): string {
  return new Intl.NumberFormat(undefined, { style: 'currency', currency }).format(minor / 10 ** minorDigits(currency));
}

/** A typed amount (12.50, 12,50, .5) as minor units, or null when it is not an amount with the currency's decimals. */
export function parseMoney(text: string, currency: string): number | null {
  const digits = minorDigits(currency);
  const t = text.trim().replace(/\s/g, '').replace(',', '.');
  const pattern = digits === 0 ? /^\d+$/ : new RegExp(`^(\\d+)(\\.(\\d{0,${digits}}))?$|^\\.(\\d{1,${digits}})$`);
  if (!pattern.test(t)) return null;
  const [whole = '0', fraction = ''] = t.split('.');
  return Number(whole || '0') * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
}

/** Minor units as the amount a person types back into a field (1250 → "12.50"). */
export const moneyInput = (minor: number, currency: string) => {
  const digits = minorDigits(currency);
  return (minor / 10 ** digits).toFixed(digits);
};
