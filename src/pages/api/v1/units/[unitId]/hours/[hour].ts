import { z } from 'zod';
import { UnitHourDetailAnswer } from '~/lib/api/hours';
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
const Params = z.object({
  hour: z
    .string()
    .transform(decoded)
    .pipe(InstantText)
    .meta({ description: 'The hour start: an ISO 8601 instant with Z or an offset (URL-encoded), or epoch milliseconds.', example: '2025-05-12T06:00:00Z' }),
});

/**
 * One unit hour opened up: its stored figures and the audit trail (detail), rebuilt on demand from the
 * stored tag hours (`rebuilt.matches`: the same inputs hash as the stored hour). The hour: ISO 8601 instant or ms.
 */
export const GET = endpoint(
  {
    params: Params,
    answers: { 200: UnitHourDetailAnswer },
    doc: {
      group: 'Hours',
      summary: 'One unit hour opened up',
      description:
        'The stored figures of one hour and its audit trail (detail), rebuilt on demand from the stored tag hours; rebuilt.matches says whether the rebuilt hour has the stored inputs hash. 404 when the unit has no computed hour starting then.',
    },
  },
  async ({ locals }, { params }) => {
    const unit = await unitHeader(params.unitId);
    requireSite(locals, unit.siteId);
    const hour = await unitHourDetail(unit.id, params.hour);
    return answer(UnitHourDetailAnswer, { unit: { id: unit.id, name: unit.name, kind: unit.kind, siteId: unit.siteId, currency: unit.currency }, hour });
  },
);
