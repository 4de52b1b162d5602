import type { APIRoute } from 'astro';
import { answer, siteAllowed, tokenForOtherSite } from '~/server/http';
import { getUploadRow, uploadView } from '~/server/services/uploads';

export const GET: APIRoute = ({ params, locals }) =>
  answer(async () => {
    const up = await getUploadRow(params.uploadId!);
    if (!siteAllowed(locals, up.siteId)) return tokenForOtherSite();
    return Response.json(uploadView(up));
  });
