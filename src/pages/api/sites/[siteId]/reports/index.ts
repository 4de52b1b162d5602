import { endpoint } from '~/server/endpoint';
import { reportMonths } from '~/server/services/report';

/** Months of the site's calendar that have unit hours, newest first, with the report links. */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const { site, months } = await reportMonths(params.siteId!);
  const base = `/api/sites/${site.id}/reports`;
  return Response.json({ site, months: months.map((m) => ({ ...m, pdf: `${base}/${m.month}/report.pdf`, csv: `${base}/${m.month}/report.csv` })) });
});
