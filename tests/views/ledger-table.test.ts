/**
 * The loss ledger table's figures (src/lib/views/ledger-table.ts): the MWh column's decimals follow
 * the largest destruction (site total or any row), and a period with no unit hour of any state says so.
 */
import { expect, it } from 'vitest';
import { ledgerHasHours, ledgerMWhDecimals } from '~/lib/views/ledger-table';
import type { LedgerAnswer } from '~/lib/views/ledger';

const hours = (steady: number, unsettled = 0, idle = 0, suspect = 0) => ({ steady, unsettled, idle, suspect });
const totals = (destruction_MWh: number, h = hours(0)) => ({ hours: h, destruction_MWh }) as LedgerAnswer['totals'];
const rows = (...mwh: number[]) => mwh.map((destruction_MWh) => ({ destruction_MWh })) as LedgerAnswer['rows'];

it('gives the MWh column the decimals of its largest figure', () => {
  expect(ledgerMWhDecimals({ totals: totals(0.4), rows: rows(0.1, 0.3) })).toBe(3);
  expect(ledgerMWhDecimals({ totals: totals(5), rows: rows(2, 3) })).toBe(2);
  expect(ledgerMWhDecimals({ totals: totals(12), rows: rows(12) })).toBe(1);
  // A row larger than the total (a negative row elsewhere) decides.
  expect(ledgerMWhDecimals({ totals: totals(90), rows: rows(150, -60) })).toBe(0);
  expect(ledgerMWhDecimals({ totals: totals(0), rows: [] })).toBe(3);
});

it('says whether the period has any unit hour', () => {
  expect(ledgerHasHours({ totals: totals(0, hours(0)) })).toBe(false);
  expect(ledgerHasHours({ totals: totals(0, hours(0, 0, 3)) })).toBe(true);
  expect(ledgerHasHours({ totals: totals(0, hours(0, 0, 0, 1)) })).toBe(true);
  expect(ledgerHasHours({ totals: totals(0, hours(2)) })).toBe(true);
});
