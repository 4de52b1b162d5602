import { z } from 'zod';
import { UnitHourAnswer } from '~/lib/api/hours';
import { answer } from '~/server/answer';
import { InstantText, endpoint, requireSite } from '~/server/endpoint';
import { unitHeader, unitHourDetail } from '~/server/services/engine-results';

/** The hour as it comes in the path (an encoded ISO 8601 instant, or ms). */
const decoded = (v: string) => {
  try {
    return decodeURIComponent(v);
  } catch {
    return v; // a stray % is left for InstantText to refuse
  }
};
const Params = z.object({ hour: z.string().transform(decoded).pipe(InstantText) });

/**
 * One unit hour opened up: its stored figures and the audit trail (detail), rebuilt on demand from the
 * stored tag hours (`rebuilt.matches`: the same inputs hash as the stored hour). The hour: ISO 8601 instant or ms.
 */
export const GET = endpoint(
  {
    params: Params,
    answers: { 200: UnitHourAnswer },
    doc: {
      summary: 'One unit hour with its audit trail',
      description: 'The hour: its start as an ISO 8601 instant or in ms. 404 when the unit has no computed hour starting then.',
      group: 'Hours',
    },
  },
  async ({ locals }, { params }) => {
    const unit = await unitHeader(params.unitId);
    requireSite(locals, unit.siteId);
    const hour = await unitHourDetail(unit.id, params.hour);
    return answer(UnitHourAnswer, { unit: { id: unit.id, name: unit.name, kind: unit.kind, siteId: unit.siteId, currency: unit.currency }, hour });
  },
);
