import { withTransaction, type Exec, type Tx } from '../db/tx';

export type { Exec, Tx };

/**
 * Runs fn in one transaction, with `exec` for pg-boss sends that must commit together with the rows
 * (no mail job without its marker, no marker without its job).
 */
export const inInsightTx = <T>(fn: (tx: Tx, exec: Exec) => Promise<T>): Promise<T> => withTransaction(fn);
