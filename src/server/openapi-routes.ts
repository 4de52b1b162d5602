/**
 * The route modules under src/pages/api/v1, found by the bundler (Vite's import.meta.glob, in the
 * server build and in tests alike), and the document built from them once per process.
 */
import { buildDocument, type OpenApiDocument, type RouteModule } from './openapi';

/** Every route module under src/pages/api/v1, keyed by its file path. */
export async function v1RouteModules(): Promise<Record<string, RouteModule>> {
  const found = import.meta.glob<RouteModule>('../pages/api/v1/**/*.{ts,js}');
  const entries = await Promise.all(Object.entries(found).map(async ([file, load]) => [file, await load()] as const));
  return Object.fromEntries(entries);
}

let built: Promise<{ document: OpenApiDocument; json: string }> | null = null;

/** The document of /api/v1 and its JSON text, built on the first call and kept. */
export function v1Document(): Promise<{ document: OpenApiDocument; json: string }> {
  built ??= v1RouteModules().then((modules) => {
    const document = buildDocument(modules);
    return { document, json: JSON.stringify(document) };
  });
  built.catch(() => (built = null));
  return built;
}
