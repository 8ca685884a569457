/**
 * Gross capex and rebate of an option. calc's OptionResult gives capex net of rebates only; a finance
 * reader wants both. This mirrors calc's private `optionCapex` (calc/assess/assess.ts) with calc's own
 * exported price-book functions, and the API test checks gross − rebate = calc's capex for every item
 * of a case, so a change in calc's capex rule shows up as a failing test, not as a wrong report.
 */
import { OPTIONS, type OptionCode } from '../../calc/assess/options.js';
import type { PriceBookInput } from '../../calc/assess/schema.js';
import { roundMoney } from '../../calc/economics/money.js';
import { DEFAULT_PRICE_BOOK, PRICE_ITEMS, installationCost, itemCost, rebateAmount, type PriceBook } from '../../calc/economics/price-book.js';

/** The price book calc uses: each missing part from DEFAULT_PRICE_BOOK (as calc merges it). */
export function effectivePriceBook(stored: PriceBookInput | undefined): PriceBook {
  const items = { ...DEFAULT_PRICE_BOOK.items };
  for (const item of PRICE_ITEMS) {
    const bands = stored?.items?.[item];
    if (bands) items[item] = bands;
  }
  return {
    items,
    motorInstallation: stored?.motorInstallation ?? DEFAULT_PRICE_BOOK.motorInstallation,
    driveInstallation: stored?.driveInstallation ?? DEFAULT_PRICE_BOOK.driveInstallation,
    rebates: stored?.rebates ?? DEFAULT_PRICE_BOOK.rebates,
  };
}

const OPTION_BY_CODE = new Map(OPTIONS.map((option) => [option.code, option]));

/**
 * Gross capex and rebate of one option.
 *
 * @param code option code; @param book the effective price book; @param ratedPowerKw [kW]
 * @param hasDriveToday true when the motor already runs on a variable-speed drive
 * @returns { gross, rebate } [currency], each rounded to cents; gross − rebate is calc's capex.
 */
export function grossCapexAndRebate(code: string, book: PriceBook, ratedPowerKw: number, hasDriveToday: boolean): { gross: number; rebate: number } {
  const option = OPTION_BY_CODE.get(code as OptionCode);
  if (!option || option.code === 'keep') return { gross: 0, rebate: 0 };
  let gross = 0;
  if (option.family === 'rewind') gross += itemCost(book.items.rewind, ratedPowerKw);
  if (option.family === 'ie3' || option.family === 'ie4' || option.family === 'ie5' || option.family === 'bldc') {
    gross += itemCost(book.items[option.family], ratedPowerKw);
    gross += installationCost(book.motorInstallation, ratedPowerKw);
  }
  if (option.speedControl) {
    if (option.family !== 'bldc' && !hasDriveToday) gross += itemCost(book.items.vsd, ratedPowerKw);
    gross += installationCost(book.driveInstallation, ratedPowerKw);
  }
  return { gross: roundMoney(gross), rebate: roundMoney(rebateAmount(book.rebates?.[option.code], gross, ratedPowerKw)) };
}
