/**
 * The caution of docs/domain.md section 8, in one wording for every page, mail and report where a
 * user acts on a result (drift and rule notices, reports, hour details, the plant model).
 */
export const SAFETY_CAUTION =
  'Steam, hot water, compressed gas and fuel systems can kill. Lossline is a monitoring aid: a notice is not an alarm, ' +
  'Lossline is not a protective or control system, and its figures depend on the instruments behind them. Any intervention ' +
  "follows the site's procedures, local codes and the judgement of licensed engineers.";
