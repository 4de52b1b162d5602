import { createHash } from 'node:crypto';
import { z } from 'zod';
import { endpoint } from '~/server/endpoint';
import { v1Document } from '~/server/openapi-routes';

const DocumentAnswer = z
  .looseObject({ openapi: z.string(), info: z.looseObject({ title: z.string(), version: z.string() }), paths: z.record(z.string(), z.unknown()) })
  .meta({ id: 'OpenApiDocument', description: 'An OpenAPI 3.1 document.' });

/** The OpenAPI 3.1 document of /api/v1 (public: it describes, it tells nothing about any site). */
export const GET = endpoint(
  {
    answers: { 200: DocumentAnswer },
    doc: { group: 'About the API', summary: 'This document', description: 'The OpenAPI 3.1 description of every /api/v1 operation, generated from the endpoints themselves.' },
  },
  async ({ request }) => {
    const { json } = await v1Document();
    const etag = `"${createHash('sha256').update(json).digest('base64url').slice(0, 27)}"`;
    const headers = { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'public, max-age=300', etag };
    if (request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
    return new Response(json, { headers });
  },
);
