import { z } from 'zod';
import { UnitHoursAnswer } from '~/lib/api/hours';
import { cachedHours } from '~/server/hours-cache';
import { endpoint, requireSite } from '~/server/endpoint';
import { unitHeader, unitHoursCsv, unitHoursOf } from '~/server/services/engine-results';

const Query = z.object({
  from: z.iso.datetime({ offset: true }),
  to: z.iso.datetime({ offset: true }),
  format: z.enum(['json', 'csv']).optional(),
});

/** A unit's hours over [from, to): JSON, or CSV with ?format=csv or Accept: text/csv (docs/api.md, "Unit hours"). */
export const GET = endpoint(
  {
    query: Query,
    answers: { 200: [UnitHoursAnswer, 'text/csv'] },
    doc: {
      summary: 'A unit’s hourly balances',
      description:
        'Hours starting in [from, to), at most 400 days, oldest first. The same rows as CSV with ?format=csv or Accept: text/csv (media type text/csv).',
      group: 'Hours',
    },
  },
  async ({ locals, request }, { params, query }) => {
    const unit = await unitHeader(params.unitId);
    requireSite(locals, unit.siteId);
    const csv = query.format === 'csv' || (query.format === undefined && /\btext\/csv\b/.test(request.headers.get('accept') ?? ''));
    if (!csv) {
      // The JSON text is kept in the read cache until unit hours, units or sites change: a request
      // then writes nothing (JSON.stringify of a week's hours was a good part of its CPU).
      const from = new Date(query.from);
      const to = new Date(query.to);
      const text = await cachedHours(
        `unit-hours-json:${unit.id}:${from.getTime()}:${to.getTime()}`,
        async () =>
          JSON.stringify({
            unit: { id: unit.id, name: unit.name, kind: unit.kind, siteId: unit.siteId, siteName: unit.siteName, timeZone: unit.timeZone, currency: unit.currency },
            from: from.toISOString(),
            to: to.toISOString(),
            hours: await unitHoursOf(unit.id, from, to),
          } satisfies z.input<typeof UnitHoursAnswer>),
        { large: true },
      );
      return new Response(text, { headers: { 'content-type': 'application/json' } });
    }
    const hours = await unitHoursOf(unit.id, new Date(query.from), new Date(query.to));
    return new Response(unitHoursCsv(hours, unit.currency), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="unit-hours-${unit.id}.csv"`,
      },
    });
  },
);
