import type { APIRoute } from 'astro';
import { answer, siteAllowed, tokenForOtherSite } from '~/server/http';
import { unitHeader, unitHourDetail } from '~/server/services/engine-results';

/**
 * One unit hour opened up: its stored figures and the audit trail (detail), rebuilt on demand from the
 * stored tag hours (`rebuilt.matches`: the same inputs hash as the stored hour). The hour: ISO 8601 instant or ms.
 */
export const GET: APIRoute = ({ params, locals }) =>
  answer(async () => {
    const unit = await unitHeader(params.unitId);
    if (!siteAllowed(locals, unit.siteId)) return tokenForOtherSite();
    const raw = decodeURIComponent(params.hour ?? '');
    const at = /^\d+$/.test(raw) ? new Date(Number(raw)) : new Date(raw);
    const hour = await unitHourDetail(unit.id, at);
    return Response.json({ unit: { id: unit.id, name: unit.name, kind: unit.kind, siteId: unit.siteId, currency: unit.currency }, hour });
  });
