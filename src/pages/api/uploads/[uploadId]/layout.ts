import { z } from 'zod';
import { LayoutProfileSchema } from '~/lib/ingest/profile';
import { endpoint } from '~/server/endpoint';
import { confirmLayout } from '~/server/services/uploads';

const Body = z.object({ name: z.string().trim().min(1).max(120), profile: LayoutProfileSchema });

export const POST = endpoint({ body: Body }, async ({ locals }, { params, body }) =>
  Response.json(await confirmLayout(params.uploadId!, body.profile as never, body.name, locals.user!.id), { status: 202 }),
);
