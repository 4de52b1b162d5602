import { endpoint } from '~/server/endpoint';
import { noticeDetail } from '~/server/services/notices';

/** One notice with its figures, the caution, and the residual and CUSUM around it. */
export const GET = endpoint({}, async (_ctx, { params }) => Response.json(await noticeDetail(params.noticeId!)));
