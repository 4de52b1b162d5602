import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { resendInvitation } from '~/server/services/users';

/** Sends a pending invitation again with a new link; the earlier links stop working. */
export const POST = endpoint({ params: z.object({ userId: z.string().min(1).max(200) }) }, async (_ctx, { params }) => Response.json(await resendInvitation(params.userId)));
