import { endpoint } from '~/server/endpoint';
import { PortInput, createPort } from '~/server/services/plant';

export const POST = endpoint({ body: PortInput }, async (_ctx, { params, body }) =>
  Response.json({ port: await createPort(params.siteId!, params.unitId!, body) }, { status: 201 }),
);
