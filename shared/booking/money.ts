/**
 * Money is always an integer count of the currency's minor unit (cents, pence…), as Stripe wants.
 * Currencies without a minor unit (yen, won…) count whole units.
 */

/** Currencies the clinic may charge in; extend with care (each needs its minor-unit rule below). */
export const CURRENCIES = ['EUR', 'GBP', 'USD', 'CHF', 'SEK', 'NOK', 'DKK', 'AUD', 'CAD', 'NZD', 'JPY', 'KRW'] as const;
export type Currency = (typeof CURRENCIES)[number];

/**
 * Zero-decimal currencies, from Stripe's documentation of currencies charged in whole units
 * (ISO 4217 minor unit 0). Only the ones in CURRENCIES matter here.
 */
export const ZERO_DECIMAL_CURRENCIES: ReadonlySet<string> = new Set(['JPY', 'KRW']);

export function minorUnitDigits(currency: string): 0 | 2 {
  return ZERO_DECIMAL_CURRENCIES.has(currency.toUpperCase()) ? 0 : 2;
}

/** 12.50 EUR → 1250; 1500 JPY → 1500. Rounds to the nearest minor unit. */
export function toMinorUnits(amount: number, currency: string): number {
  return Math.round(amount * 10 ** minorUnitDigits(currency));
}

export function fromMinorUnits(minor: number, currency: string): number {
  return minor / 10 ** minorUnitDigits(currency);
}

/** "€90.00", "¥9,000" in the viewer's locale. */
export function formatMoney(minor: number, currency: string, locale?: string): string {
  const digits = minorUnitDigits(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits }).format(
    fromMinorUnits(minor, currency),
  );
}
