import type { APIRoute } from 'astro';
import { apiError } from '~/server/errors';
import { revokeApiToken } from '~/server/tokens';

export const DELETE: APIRoute = async ({ params }) =>
  (await revokeApiToken(params.tokenId!)) ? Response.json({ revoked: true }) : apiError('NOT_FOUND', 'No such live token.');
