import type { APIRoute } from 'astro';
import { z } from 'zod';
import { apiError } from '~/server/errors';
import { answer, siteAllowed, tokenForOtherSite } from '~/server/http';
import { unitHeader, unitHoursCsv, unitHoursOf } from '~/server/services/engine-results';

const Query = z.object({
  from: z.iso.datetime({ offset: true }),
  to: z.iso.datetime({ offset: true }),
  format: z.enum(['json', 'csv']).optional(),
});

/** A unit's hours over [from, to): JSON, or CSV with ?format=csv or Accept: text/csv (docs/api.md, "Unit hours"). */
export const GET: APIRoute = ({ params, url, locals, request }) =>
  answer(async () => {
    const parsed = Query.safeParse(Object.fromEntries(url.searchParams));
    if (!parsed.success) return apiError('VALIDATION_FAILED', 'Give from and to (ISO 8601 with Z or an offset); format is json or csv.', parsed.error.issues);
    const unit = await unitHeader(params.unitId);
    if (!siteAllowed(locals, unit.siteId)) return tokenForOtherSite();
    const q = parsed.data;
    const hours = await unitHoursOf(unit.id, new Date(q.from), new Date(q.to));
    const csv = q.format === 'csv' || (q.format === undefined && /\btext\/csv\b/.test(request.headers.get('accept') ?? ''));
    if (csv) {
      return new Response(unitHoursCsv(hours, unit.currency), {
        headers: {
          'content-type': 'text/csv; charset=utf-8',
          'content-disposition': `attachment; filename="unit-hours-${unit.id}.csv"`,
        },
      });
    }
    return Response.json({
      unit: { id: unit.id, name: unit.name, kind: unit.kind, siteId: unit.siteId, siteName: unit.siteName, timeZone: unit.timeZone, currency: unit.currency },
      from: new Date(q.from).toISOString(),
      to: new Date(q.to).toISOString(),
      hours,
    });
  });
