import { endpoint } from '~/server/endpoint';
import { PortUpdateInput, deletePort, updatePort } from '~/server/services/plant';

export const PATCH = endpoint({ body: PortUpdateInput }, async (_ctx, { params, body }) => {
  await updatePort(params.siteId!, params.unitId!, params.portId!, body);
  return Response.json({ ok: true });
});

export const DELETE = endpoint({}, async (_ctx, { params }) => {
  await deletePort(params.siteId!, params.unitId!, params.portId!);
  return Response.json({ ok: true });
});
