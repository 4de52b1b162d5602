import { z } from 'zod';
import { endpoint, requireSite } from '~/server/endpoint';
import { exportModel, importModel } from '~/server/services/plant-model';

/** The site's plant model file (docs/plant-model.md). */
export const GET = endpoint({}, async ({ locals }, { params }) => {
  if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
  const model = await exportModel(params.siteId!);
  const file = `${model.site.name.replace(/[^\w.-]+/g, '-').toLowerCase()}.plant-model.json`;
  return new Response(JSON.stringify(model, null, 2) + '\n', {
    headers: { 'content-type': 'application/json; charset=utf-8', 'content-disposition': `inline; filename="${file}"` },
  });
});

/** Replaces the site's model with the file's: all or nothing, every problem with its JSON path (checked by the service). */
export const PUT = endpoint({ body: z.unknown() }, async ({ locals }, { params, body }) => {
  if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
  return Response.json(await importModel(params.siteId!, body));
});
