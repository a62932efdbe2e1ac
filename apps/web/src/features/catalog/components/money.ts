// Prices are typed as the rink writes them (12.50) and sent as integer minor units (1250), with the number of
// decimals the currency itself has, so a currency without cents takes whole amounts only.

export const minorDigits = (currency: string) => new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;

export function parsePrice(text: string, currency: string): number | null {
  const digits = minorDigits(currency);
  const t = text.trim().replace(/\s/g, '').replace(',', '.');
  const pattern = digits === 0 ? /^\d+$/ : new RegExp(`^(\\d+)(\\.(\\d{0,${digits}}))?$|^\\.(\\d{1,${digits}})$`);
  if (!pattern.test(t)) return null;
  const [whole = '0', fraction = ''] = t.split('.');
  return Number(whole || '0') * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
}

export const priceInput = (minor: number, currency: string) => {
  const digits = minorDigits(currency);
  return (minor / 10 ** digits).toFixed(digits);
};

export const formatPrice = (minor: number, currency: string) =>
  new Intl.NumberFormat(undefined, { style: 'currency', currency }).format(minor / 10 ** minorDigits(currency));
