import type { APIRoute } from 'astro';
import { answer } from '~/server/http';
import { completeBrowserUpload } from '~/server/services/uploads';

export const POST: APIRoute = ({ params }) => answer(async () => Response.json(await completeBrowserUpload(params.uploadId!), { status: 202 }));
