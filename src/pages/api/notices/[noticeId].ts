import { endpoint } from '~/server/endpoint';
import { noticeDetail } from '~/server/services/notices';
import { oneWithDisplay } from '~/server/services/notice-display';

/** One notice with its figures, the caution, and the residual and CUSUM around it. */
export const GET = endpoint({}, async (_ctx, { params }) => {
  const detail = await noticeDetail(params.noticeId!);
  return Response.json({ ...detail, notice: await oneWithDisplay(detail.notice) });
});
