import { endpoint } from '~/server/endpoint';
import { AppError } from '~/server/errors';
import { revokeApiToken } from '~/server/tokens';

export const DELETE = endpoint({}, async (_ctx, { params }) => {
  if (!(await revokeApiToken(params.tokenId!))) throw new AppError('NOT_FOUND', 'No such live token.');
  return Response.json({ revoked: true });
});
