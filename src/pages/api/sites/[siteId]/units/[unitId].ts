import { endpoint } from '~/server/endpoint';
import { UnitUpdateInput, deleteUnit, unitDetail, updateUnit } from '~/server/services/plant';
import { linkHistory } from '~/server/services/plant-links';

/** The unit with ports, current links, status and the history of its link versions. */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const detail = await unitDetail(params.siteId!, params.unitId!);
  return Response.json({ unit: detail.unit, history: await linkHistory(params.siteId!, params.unitId!) });
});

export const PATCH = endpoint({ body: UnitUpdateInput }, async (_ctx, { params, body }) => Response.json({ unit: await updateUnit(params.siteId!, params.unitId!, body) }));

export const DELETE = endpoint({}, async (_ctx, { params }) => {
  await deleteUnit(params.siteId!, params.unitId!);
  return Response.json({ ok: true });
});
