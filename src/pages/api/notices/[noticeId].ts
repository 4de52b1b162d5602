import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { noticeDetail } from '~/server/services/notices';

/** One notice with its figures, the caution, and the residual and CUSUM around it. */
export const GET: APIRoute = async ({ params }) => answer(async () => Response.json(await noticeDetail(params.noticeId!)));
