import { z } from 'zod';
import { ModelFile, ModelReplaced } from '~/lib/api/model';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { exportModel, importModel } from '~/server/services/plant-model';

/** The site's plant model file (docs/plant-model.md). */
export const GET = endpoint(
  {
    answers: { 200: ModelFile },
    doc: { group: 'Plant model', summary: "The site's plant model file", description: 'Units, ports, links to tags and the site settings, as a file that PUT takes back (docs/plant-model.md).' },
  },
  async ({ locals }, { params }) => {
    if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
    const model: ModelFile = await exportModel(params.siteId!);
    const file = `${model.site.name.replace(/[^\w.-]+/g, '-').toLowerCase()}.plant-model.json`;
    return new Response(JSON.stringify(model, null, 2) + '\n', {
      headers: { 'content-type': 'application/json; charset=utf-8', 'content-disposition': `inline; filename="${file}"` },
    });
  },
);

/** Replaces the site's model with the file's: all or nothing, every problem with its JSON path (checked by the service). */
export const PUT = endpoint(
  {
    // Any JSON: the service checks it against the model file's schema and names every problem's JSON path.
    body: z.unknown().meta({ override: { $ref: '#/components/schemas/PlantModel' } }),
    answers: { 200: ModelReplaced },
    doc: {
      group: 'Plant model',
      summary: "Replace the site's plant model",
      description:
        'All or nothing: on any problem 400 with every issue and its JSON path, and nothing changes. Hours the change touches are queued for computing again (recompute).',
    },
  },
  async ({ locals }, { params, body }) => {
    if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
    return answer(ModelReplaced, await importModel(params.siteId!, body));
  },
);
