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

/**
 * The smallest amount Stripe will charge in each currency, in minor units. From memory of Stripe's
 * "Minimum and maximum charge amounts" table (stripe.com/docs/currencies), not re-checked here:
 * 0.50 for USD, EUR, CHF, AUD, CAD and NZD, £0.30, 2.50 kr DKK, 3.00 kr NOK and SEK, ¥50.
 * KRW is not in that table as we remember it; ₩1,000 is our own safe choice (above the ~US$0.50
 * equivalent Stripe asks for elsewhere). A lower fee would be refused by Stripe at payment time.
 */
export const MIN_CHARGE_MINOR: Readonly<Record<Currency, number>> = {
  EUR: 50,
  GBP: 30,
  USD: 50,
  CHF: 50,
  SEK: 300,
  NOK: 300,
  DKK: 250,
  AUD: 50,
  CAD: 50,
  NZD: 50,
  JPY: 50,
  KRW: 1000,
};

/** The smallest chargeable fee for a currency (minor units); unknown currencies get the common 50. */
export function minimumChargeMinor(currency: string): number {
  return MIN_CHARGE_MINOR[currency.toUpperCase() as Currency] ?? 50;
}

/** Null when `minor` can be charged, else a sentence for the fee field. */
export function feeBelowMinimum(minor: number, currency: string): string | null {
  const minimum = minimumChargeMinor(currency);
  if (minor >= minimum) return null;
  return `The fee must be at least ${formatMoney(minimum, currency, 'en-GB')}: card payments in ${currency.toUpperCase()} cannot be smaller.`;
}
