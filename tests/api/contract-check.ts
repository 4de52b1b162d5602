/**
 * The contract test's judge: every answer is checked against the OpenAPI document of /api/v1 with
 * Ajv (JSON Schema 2020-12, the dialect of OpenAPI 3.1) and ajv-formats.
 */
import { Ajv2020 } from 'ajv/dist/2020.js';
import addFormats from 'ajv-formats';
import { expect } from 'vitest';
import type { OpenApiDocument } from '~/server/openapi';

type Json = Record<string, any>;
export interface Operation {
  path: string;
  method: string;
  op: Json;
}

const DOC_ID = 'urn:lossline:api-v1';

/** Every operation of the document. */
export function operations(doc: OpenApiDocument): Operation[] {
  return Object.entries(doc.paths ?? {}).flatMap(([path, item]) =>
    Object.entries(item as Json)
      .filter(([m]) => ['get', 'post', 'put', 'patch', 'delete'].includes(m))
      .map(([method, op]) => ({ path, method: method.toUpperCase(), op: op as Json })),
  );
}

/** A judge of answers: each answer's status, media type and body against the document. */
export function judge(doc: OpenApiDocument) {
  const ajv = new Ajv2020({ strict: false, allErrors: true });
  (addFormats as unknown as (a: Ajv2020) => void)(ajv);
  ajv.addFormat('binary', true);
  ajv.addSchema({ $id: DOC_ID, components: doc.components });
  const compiled = new Map<string, ReturnType<Ajv2020['compile']>>();
  const validator = (schema: Json) => {
    const text = JSON.stringify(schema).replaceAll('"#/components/', `"${DOC_ID}#/components/`);
    let v = compiled.get(text);
    if (!v) compiled.set(text, (v = ajv.compile(JSON.parse(text))));
    return v;
  };

  /** Checks one answer; returns its status. `where` names the call in a failure. */
  return async function check(o: Operation, res: Response, where: string): Promise<number> {
    const text = await res.text();
    expect(Object.keys(o.op.responses ?? {}), `${where}: answered ${res.status}, which the document does not describe for ${o.method} ${o.path}: ${text.slice(0, 300)}`).toContain(String(res.status));
    const described = o.op.responses[String(res.status)];
    const content = described.content as Json | undefined;
    if (!content) {
      expect(text, `${where}: ${res.status} is described without a body`).toBe('');
      return res.status;
    }
    const media = (res.headers.get('content-type') ?? '').split(';')[0]!.trim();
    expect(Object.keys(content), `${where}: answered ${media} for ${res.status}`).toContain(media);
    const schema = content[media].schema as Json;
    if (media === 'application/json') {
      const v = validator(schema);
      const ok = v(JSON.parse(text));
      expect(ok, `${where}: the ${res.status} body does not fit the document: ${ajv.errorsText(v.errors)}\n${text.slice(0, 500)}`).toBe(true);
    } else {
      expect(text.length, `${where}: an empty ${media} answer`).toBeGreaterThan(0);
    }
    return res.status;
  };
}
