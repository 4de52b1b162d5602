/**
 * The figures the loss ledger's table shows beside its rows (src/components/insight/views/LedgerTable.tsx):
 * the decimals of its MWh column and whether the period has any unit hour at all. Pure.
 */
import { sizeDecimals } from '../format';
import { HOUR_STATES } from '../hour-states';
import type { LedgerAnswer } from './ledger';

/** Decimals of the MWh column: fitting the largest destruction, the site total's or any row's. */
export function ledgerMWhDecimals(l: Pick<LedgerAnswer, 'totals' | 'rows'>): number {
  return sizeDecimals(Math.max(l.totals.destruction_MWh, ...l.rows.map((r) => r.destruction_MWh)));
}

/** True when the period has at least one unit hour of any state. */
export function ledgerHasHours(l: Pick<LedgerAnswer, 'totals'>): boolean {
  return HOUR_STATES.some((s) => l.totals.hours[s] > 0);
}
