import { z } from 'zod';
import { ModelFileAnswer, ModelPutAnswer } from '~/lib/api/model';
import { answer } from '~/server/answer';
import { endpoint, requireSite } from '~/server/endpoint';
import { exportModel, importModel } from '~/server/services/plant-model';

/** The site's plant model file (format at /help/model-file). */
export const GET = endpoint(
  {
    answers: { 200: ModelFileAnswer },
    doc: {
      summary: 'The site’s plant model file',
      description: 'The model as one JSON document (format at /help/model-file), ready to edit and PUT back.',
      group: 'Plant model',
    },
  },
  async ({ locals }, { params }) => {
    if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
    const model = await exportModel(params.siteId!);
    const file = `${model.site.name.replace(/[^\w.-]+/g, '-').toLowerCase()}.plant-model.json`;
    return new Response(JSON.stringify(model, null, 2) + '\n', {
      headers: { 'content-type': 'application/json; charset=utf-8', 'content-disposition': `inline; filename="${file}"` },
    });
  },
);

/** Replaces the site's model with the file's: all or nothing, every problem with its JSON path (checked by the service). */
export const PUT = endpoint(
  {
    body: z.unknown(),
    answers: { 200: ModelPutAnswer },
    doc: {
      summary: 'Replace the site’s plant model',
      description:
        'All or nothing: every problem is answered with its JSON path and nothing changes. Answers the ids of what the file created, changed and removed, every unit’s id by name, and `renamed` when the file renamed the site. Admin tokens only.',
      group: 'Plant model',
    },
  },
  async ({ locals }, { params, body }) => {
    if (locals.apiToken) requireSite(locals, params.siteId!); // people: the guard checked their sites
    return answer(ModelPutAnswer, await importModel(params.siteId!, body));
  },
);
