import { ANY_ROLE, type Role } from '../lib/roles';

/**
 * Who may call what: the one table. Every route under src/pages/api (and every page) is listed here
 * with the roles it admits, per HTTP method or for all methods ('*'). src/middleware.ts enforces it
 * (401 when nobody is signed in, 403 for a role not admitted) and tests/foundation/policy.test.ts
 * fails when a route file has no entry here, so no endpoint can forget to declare one.
 *
 * 'public' admits anyone, signed in or not. `apiToken: true` also admits a site API token
 * (Authorization: Bearer ...) in place of a session; the endpoint then checks the token's site.
 */
export type Admit = 'public' | readonly Role[];
export interface RoutePolicy {
  methods: Partial<Record<'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE' | '*', Admit>>;
  apiToken?: boolean;
}

const ADMIN: readonly Role[] = ['admin'];
const LEADS: readonly Role[] = ['admin', 'energy-lead'];
const UPLOADERS: readonly Role[] = ['admin', 'energy-lead', 'operator'];

/** Route patterns as Astro spells its file routes: [param] for one segment, [...rest] for many. */
export const API_POLICY: Record<string, RoutePolicy> = {
  '/api/auth/[...all]': { methods: { '*': 'public' } },
  '/api/health': { methods: { GET: 'public' } },
  '/api/me': { methods: { GET: ANY_ROLE } },
  '/api/admin/users': { methods: { GET: ADMIN, POST: ADMIN } },
  '/api/admin/users/[userId]': { methods: { PATCH: ADMIN } },
  '/api/admin/users/[userId]/resend': { methods: { POST: ADMIN } },
  // --- ingest (uploads, API tokens, tag hours) ---
  '/api/sites/[siteId]/uploads': { methods: { GET: ANY_ROLE, POST: UPLOADERS } },
  '/api/sites/[siteId]/quality-codes': { methods: { GET: ANY_ROLE, PUT: LEADS } },
  '/api/uploads/[uploadId]/complete': { methods: { POST: UPLOADERS } },
  '/api/uploads/[uploadId]/retry': { methods: { POST: UPLOADERS } },
  '/api/uploads/[uploadId]/layout': { methods: { POST: UPLOADERS } },
  '/api/uploads/[uploadId]/rejects.csv': { methods: { GET: ANY_ROLE } },
  '/api/sites/[siteId]/tokens': { methods: { GET: ADMIN, POST: ADMIN } },
  '/api/tokens/[tokenId]': { methods: { DELETE: ADMIN } },
  '/api/v1/openapi.json': { methods: { GET: 'public' } },
  '/api/v1/sites/[siteId]/files': { methods: { POST: UPLOADERS }, apiToken: true },
  '/api/v1/uploads/[uploadId]': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/sites/[siteId]/tag-hours': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/sites/[siteId]/uploads': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/sites/[siteId]/state': { methods: { GET: ANY_ROLE }, apiToken: true },
  // --- plant model ---
  '/api/sites': { methods: { GET: ANY_ROLE, POST: ADMIN } },
  '/api/sites/from-model': { methods: { POST: ADMIN } },
  '/api/sites/[siteId]': { methods: { GET: ANY_ROLE, PATCH: ADMIN, DELETE: ADMIN } },
  '/api/sites/[siteId]/units': { methods: { GET: ANY_ROLE, POST: ADMIN } },
  '/api/sites/[siteId]/units/[unitId]': { methods: { GET: ANY_ROLE, PATCH: ADMIN, DELETE: ADMIN } },
  '/api/sites/[siteId]/units/[unitId]/ports': { methods: { POST: ADMIN } },
  '/api/sites/[siteId]/units/[unitId]/ports/[portId]': { methods: { PATCH: ADMIN, DELETE: ADMIN } },
  '/api/sites/[siteId]/links': { methods: { GET: ANY_ROLE, POST: ADMIN } },
  '/api/sites/[siteId]/links/[linkId]': { methods: { DELETE: ADMIN } },
  '/api/sites/[siteId]/tags': { methods: { GET: ANY_ROLE } },
  '/api/v1/sites/[siteId]/model': { methods: { GET: ANY_ROLE, PUT: ADMIN }, apiToken: true },
  '/api/v1/sites/[siteId]': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/sites/[siteId]/units': { methods: { GET: ANY_ROLE }, apiToken: true },
  // --- engine ---
  '/api/v1/units/[unitId]/hours': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/units/[unitId]/hours/[hour]': { methods: { GET: ANY_ROLE }, apiToken: true },
  // --- baselines and drift ---
  '/api/units/[unitId]/baselines': { methods: { GET: ANY_ROLE, POST: LEADS } },
  '/api/baselines/[baselineId]': { methods: { GET: ANY_ROLE } },
  '/api/baselines/[baselineId]/accept': { methods: { POST: LEADS } },
  '/api/baselines/[baselineId]/discard': { methods: { POST: LEADS } },
  '/api/units/[unitId]/drift-settings': { methods: { GET: ANY_ROLE, PUT: LEADS } },
  '/api/units/[unitId]/limits': { methods: { GET: ANY_ROLE, PUT: LEADS } },
  '/api/notices': { methods: { GET: ANY_ROLE } },
  '/api/v1/sites/[siteId]/notices': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/v1/sites/[siteId]/baselines': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/notices/settings': { methods: { GET: ANY_ROLE, PUT: ['admin', 'energy-lead'] } },
  '/api/notices/preferences': { methods: { GET: ['admin', 'energy-lead', 'planner'], PUT: ['admin', 'energy-lead', 'planner'] } },
  '/api/notices/[noticeId]': { methods: { GET: ANY_ROLE } },
  '/api/notices/[noticeId]/acknowledge': { methods: { POST: ['admin', 'energy-lead', 'planner'] } },
  '/api/notices/[noticeId]/close': { methods: { POST: ['admin', 'energy-lead', 'planner'] } },
  // --- trends, ledger, reports ---
  '/api/units/[unitId]/trend': { methods: { GET: ANY_ROLE } },
  '/api/sites/[siteId]/ledger': { methods: { GET: ANY_ROLE } },
  '/api/v1/sites/[siteId]/ledger': { methods: { GET: ANY_ROLE }, apiToken: true },
  '/api/sites/[siteId]/flow': { methods: { GET: ANY_ROLE } },
  '/api/sites/[siteId]/reports': { methods: { GET: LEADS } },
  '/api/sites/[siteId]/reports/[month]/report.pdf': { methods: { GET: LEADS } },
  '/api/sites/[siteId]/reports/[month]/report.csv': { methods: { GET: LEADS } },
};

/** Pages: the same rule, for GET. Pages not listed need a signed-in person of any role. */
export const PAGE_POLICY: Record<string, Admit> = {
  '/sign-in': 'public',
  '/forgot-password': 'public',
  '/set-password': 'public',
  '/admin/users': ADMIN,
  // --- ingest ---
  '/uploads': UPLOADERS,
  '/admin/tokens': ADMIN,
  // --- plant model ---
  '/plant': ANY_ROLE,
  '/plant/[...rest]': ANY_ROLE,
  // --- engine ---
  '/units': ANY_ROLE,
  '/units/[unitId]': ANY_ROLE,
  // --- baselines and drift ---
  '/baselines': ANY_ROLE,
  '/baselines/new': LEADS,
  '/baselines/[baselineId]': ANY_ROLE,
  '/notices': ANY_ROLE,
  '/notices/[noticeId]': ANY_ROLE,
  // --- trends, ledger, reports ---
  '/trends': ANY_ROLE,
  '/trends/[unitId]': ANY_ROLE,
  '/ledger': ANY_ROLE,
  '/reports': LEADS,
  // --- help ---
  '/help': ANY_ROLE,
  '/help/[...rest]': ANY_ROLE,
};

export { ADMIN, LEADS, UPLOADERS };

interface Compiled {
  pattern: string;
  regex: RegExp;
  specificity: number;
  params: string[];
}

function compile(pattern: string): Compiled {
  const parts = pattern.split('/').filter(Boolean);
  let specificity = 0;
  const params: string[] = [];
  const body = parts
    .map((p) => {
      if (/^\[\.\.\.[^\]]+\]$/.test(p)) return '(?:/.*)?';
      const one = p.match(/^\[([^\]]+)\]$/);
      if (one) {
        specificity += 1;
        params.push(one[1]!);
        return '/([^/]+)';
      }
      specificity += 10;
      return '/' + p.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    })
    .join('');
  return { pattern, regex: new RegExp(`^${body}/?$`), specificity, params };
}

const compiledApi = Object.keys(API_POLICY)
  .map(compile)
  .sort((a, b) => b.specificity - a.specificity);
const compiledPages = Object.keys(PAGE_POLICY)
  .map(compile)
  .sort((a, b) => b.specificity - a.specificity);

/** The policy entry for an API path, or null when none matches (which the middleware refuses). */
export function apiPolicyFor(pathname: string): { pattern: string; policy: RoutePolicy; params: Record<string, string> } | null {
  const hit = compiledApi.find((c) => c.regex.test(pathname));
  if (!hit) return null;
  return { pattern: hit.pattern, policy: API_POLICY[hit.pattern]!, params: paramsOf(hit, pathname) };
}

function paramsOf(c: Compiled, pathname: string): Record<string, string> {
  const m = pathname.match(c.regex)!;
  const out: Record<string, string> = {};
  c.params.forEach((name, i) => {
    const raw = m[i + 1]!;
    let value = raw;
    try {
      value = decodeURIComponent(raw);
    } catch {
      // left as sent: it will not be a valid id
    }
    out[name] = value;
  });
  return out;
}

/**
 * Pages whose address names a site's thing, and which parameter that is: the guard checks the
 * person may use its site, as for the API.
 */
const PAGE_SITE_PARAMS: [RegExp, string][] = [
  [/^\/plant\/[^/]+\/units\/([^/]+)\/?$/, 'unitId'],
  [/^\/plant\/([^/]+)(?:\/.*)?$/, 'siteId'],
  [/^\/(?:units|trends)\/([^/]+)\/?$/, 'unitId'],
  [/^\/baselines\/((?!new\/?$)[^/]+)\/?$/, 'baselineId'],
  [/^\/notices\/([^/]+)\/?$/, 'noticeId'],
];

export function pageSiteParam(pathname: string): { name: string; value: string } | null {
  for (const [re, name] of PAGE_SITE_PARAMS) {
    const m = pathname.match(re);
    if (m) {
      try {
        return { name, value: decodeURIComponent(m[1]!) };
      } catch {
        return { name, value: m[1]! };
      }
    }
  }
  return null;
}

export function admitFor(policy: RoutePolicy, method: string): Admit | null {
  const m = method.toUpperCase() as keyof RoutePolicy['methods'];
  return policy.methods[m] ?? policy.methods['*'] ?? null;
}

export function pagePolicyFor(pathname: string): Admit {
  const hit = compiledPages.find((c) => c.regex.test(pathname));
  return hit ? PAGE_POLICY[hit.pattern]! : ANY_ROLE;
}

/** The outcome of a policy check, before any endpoint code runs. */
export function decide(admit: Admit | null, role: Role | null): 'allow' | 401 | 403 | 405 {
  if (admit === null) return 405;
  if (admit === 'public') return 'allow';
  if (!role) return 401;
  return admit.includes(role) ? 'allow' : 403;
}
