/**
 * The unit_hours rows the engine writes: a computed hour's row, a fault row (an hour that could not
 * be computed), and the batched insert-or-replace; and the span of hours the engine computes at all.
 */
import type { UnitHourResult } from '~/lib/engine';
import { unitHours } from '../db/schema';
import { replacedByExcluded } from '../db/upsert';
import type { Reader } from './engine-inputs';
import { DAY_MS, hourCeil } from '~/lib/time';

/** Rows per INSERT ... ON CONFLICT statement. */
const WRITE_BATCH = 200;

/** The span of hours the engine computes: 1900 to two days from now (uploads accept up to one). */
export function saneSpan(nowMs = Date.now()): [number, number] {
  return [Date.UTC(1900, 0, 1), hourCeil(nowMs + 2 * DAY_MS)];
}

/** The row of an hour whose computation failed: suspect, with the reason, no figures. */
export function faultRow(unitId: string, t: number, message: string, now: Date): typeof unitHours.$inferInsert {
  return {
    unitId,
    hourStart: new Date(t),
    state: 'suspect',
    reasons: [{ code: 'COMPUTE_FAILED', message: `This hour could not be computed (${message.slice(0, 300)}); the other hours were.` }],
    load: null,
    loadUnit: null,
    T0_K: null,
    p0_Pa: null,
    fuel_W: null,
    product_W: null,
    loss_W: null,
    destruction_W: null,
    efficiency: null,
    efficiency_U: null,
    destruction_U_W: null,
    closure_pct: null,
    entropyGeneration_W_per_K: null,
    destructionCost_per_h: null,
    modelVersion: 'fault',
    inputsHash: `fault:${now.getTime()}`,
    computedAt: now,
  };
}

/** The unit_hours row of a computed hour. */
export function unitHourRowOf(unitId: string, t: number, res: UnitHourResult, now: Date): typeof unitHours.$inferInsert {
  return {
    unitId,
    hourStart: new Date(t),
    state: res.state,
    reasons: res.reasons,
    load: res.load,
    loadUnit: res.loadUnit,
    T0_K: res.T0_K,
    p0_Pa: res.p0_Pa,
    fuel_W: res.fuel_W,
    product_W: res.product_W,
    loss_W: res.loss_W,
    destruction_W: res.destruction_W,
    efficiency: res.efficiency,
    efficiency_U: res.efficiency_U,
    destruction_U_W: res.destruction_U_W,
    closure_pct: res.closure_pct,
    entropyGeneration_W_per_K: res.entropyGeneration_W_per_K,
    destructionCost_per_h: res.destructionCost_per_h,
    modelVersion: res.modelVersion,
    inputsHash: res.inputsHash,
    computedAt: now,
  };
}

/** Writes unit hours (insert or replace), in batches. */
export async function writeUnitHours(tx: Reader, rows: (typeof unitHours.$inferInsert)[]) {
  for (let i = 0; i < rows.length; i += WRITE_BATCH) {
    await tx
      .insert(unitHours)
      .values(rows.slice(i, i + WRITE_BATCH))
      .onConflictDoUpdate({
        target: [unitHours.unitId, unitHours.hourStart],
        set: replacedByExcluded(unitHours, ['state', 'reasons', 'load', 'loadUnit', 'T0_K', 'p0_Pa', 'fuel_W', 'product_W', 'loss_W', 'destruction_W', 'efficiency', 'efficiency_U', 'destruction_U_W', 'closure_pct', 'entropyGeneration_W_per_K', 'destructionCost_per_h', 'modelVersion', 'inputsHash', 'computedAt']),
      });
  }
}

