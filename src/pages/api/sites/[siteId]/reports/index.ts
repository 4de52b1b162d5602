import { endpoint } from '~/server/endpoint';
import { reportMonths } from '~/server/services/report';

/** Months of the site's calendar that have unit hours, newest first, with the report links. */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const { site, months, latest } = await reportMonths(params.siteId!);
  const base = `/api/sites/${site.id}/reports`;
  // `latest`: the month the reports open on, the latest full month with data.
  return Response.json({ site, latest, months: months.map((m) => ({ ...m, pdf: `${base}/${m.month}/report.pdf`, csv: `${base}/${m.month}/report.csv` })) });
});
