/**
 * Loads the demo site through the product's normal paths, so a fresh Lossline shows a year of a
 * plant with its drift notices:
 *
 *   1. the model file (./harrowgate.model.json, built by ./site.ts) goes into the demo site: a new
 *      site is created from it, an existing one without units gets it by PUT /api/v1/sites/{id}/model,
 *      on first start only: a model an admin has edited since is left alone;
 *   2. the weekly historian exports (./generate.ts) arrive as machine uploads (POST
 *      /api/v1/sites/{id}/files with a site token), only the ones the site does not have yet;
 *   3. it waits while the worker reads them (GET /api/v1/uploads/{id}) and the engine computes the
 *      unit hours;
 * Its /api/v1 calls use the typed client of ./api-client.ts (openapi-fetch, the document's types).
 *   4. per unit without a baseline, a baseline is fitted on the months before the planted faults and
 *      accepted (src/server/services/baselines.ts), which queues the drift check; it waits for the
 *      check and reports the drift notices (their mails go to the energy leads and planners).
 *
 * Idempotent and quick when everything is there already. Everything is reported through `log`.
 */
import { and, count, eq, gte, inArray, lt, sql } from 'drizzle-orm';
import { db } from '~/server/db/client';
import { baselines, driftNotices, noticeMails, plantUnits, sites, unitHours, uploads, user } from '~/server/db/schema';
import { QUEUES } from '~/jobs';
import { createSiteFromModel } from '~/server/services/plant-model';
import { AppError } from '~/server/errors';
import { acceptBaseline, fitDraft } from '~/server/services/baselines';
import type { BaselineTerm } from '~/lib/analytics/baseline';
import { DEMO_DEFAULTS, generateExports, plannedFileNames, resolvePlan, siteTimeText, type GenerateOptions } from './generate';
import { demoModel, DEMO_SITE_NAME } from './site';
import { apiFailure, demoApiClient, type V1Client } from './api-client';

export interface LoadOptions extends Pick<GenerateOptions, 'start' | 'days' | 'seed'> {
  /** the site to load into (created from the model when missing); default the demo site's name */
  siteName?: string;
  /** wait for reading, unit hours, baselines and the drift check; default true */
  wait?: boolean;
  /** give up waiting after this long [ms]; default 45 minutes */
  waitTimeoutMs?: number;
  /** how often to look [ms]; default 2000 */
  pollMs?: number;
  log?: (line: string) => void;
}

export interface LoadReport {
  siteId: string;
  createdSite: boolean;
  importedModel: boolean;
  planned: number;
  uploaded: string[];
  /** planned files the site already had */
  alreadyThere: number;
  /** latest upload per planned file, by status */
  statuses: Record<string, number>;
  unitHours: number;
  baselines: { unit: string; outcome: string }[];
  notices: number;
  noticeMails: number;
  /** what was not waited for, and why */
  notWaited: string[];
}

/** Upload states that mean the file is in hand (no need to send it again). */
const IN_HAND = ['queued', 'processing', 'done', 'read-with-problems', 'needs-review'];
/** Terms of the demo baselines: load, ambient and the load-ambient interaction (exergy destruction is about T0 S_gen). */
export const DEMO_BASELINE_TERMS: BaselineTerm[] = ['load', 'T_amb', 'load^2', 'load*T_amb'];
/** A unit gets a baseline only if at least this share of the reference period's hours were steady (PRV1 is shut in normal operation). */
export const MIN_STEADY_SHARE = 0.1;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function adminUserId(): Promise<string | null> {
  const [a] = await db().select({ id: user.id }).from(user).where(eq(user.role, 'admin')).orderBy(user.createdAt).limit(1);
  return a?.id ?? null;
}

/** Latest upload per planned file name. */
async function latestUploads(siteId: string, names: readonly string[]) {
  if (!names.length) return new Map<string, { id: string; status: string; reason: string | null }>();
  const rows = await db()
    .select({ id: uploads.id, fileName: uploads.fileName, status: uploads.status, reason: uploads.failureReason, createdAt: uploads.createdAt })
    .from(uploads)
    .where(and(eq(uploads.siteId, siteId), inArray(uploads.fileName, [...names])))
    .orderBy(uploads.createdAt);
  const latest = new Map<string, { id: string; status: string; reason: string | null }>();
  for (const r of rows) {
    const prev = latest.get(r.fileName);
    // a file in hand wins over a later failed attempt
    if (!prev || !IN_HAND.includes(prev.status) || IN_HAND.includes(r.status)) latest.set(r.fileName, { id: r.id, status: r.status, reason: r.reason });
  }
  return latest;
}

/** Jobs of some queues that are waiting or running. */
async function pendingJobs(...names: string[]): Promise<number> {
  const res = await db().execute(sql`select count(*)::int as n from pgboss.job where name in (${sql.join(names.map((n) => sql`${n}`), sql`, `)}) and state in ('created', 'retry', 'active')`);
  return (res.rows[0] as { n: number }).n;
}

/**
 * Waits until `pending()` is 0. Gives up (returns a reason) at the deadline, or when the count has
 * not moved for `stallMs` (nobody works that queue).
 */
async function waitUntilZero(what: string, pending: () => Promise<number>, o: { deadline: number; pollMs: number; stallMs: number; log: (s: string) => void; progress?: (n: number) => string }): Promise<string | null> {
  let last = -1;
  let lastChange = Date.now();
  for (;;) {
    const n = await pending();
    if (n === 0) return null;
    if (n !== last) {
      if (o.progress) o.log(o.progress(n));
      last = n;
      lastChange = Date.now();
    }
    if (Date.now() > o.deadline) return `${what}: still ${n} after the time allowed`;
    if (Date.now() - lastChange > o.stallMs) return `${what}: ${n} waiting and none taken for ${Math.round(o.stallMs / 1000)} s (is the worker running?)`;
    await sleep(o.pollMs);
  }
}

/** Loads the demo (see the module comment). */
export async function loadDemo(opts: LoadOptions = {}): Promise<LoadReport> {
  const held: { client?: Awaited<ReturnType<typeof demoApiClient>> } = {};
  try {
    return await load(opts, async (siteId) => (held.client ??= await demoApiClient(siteId)).api);
  } finally {
    await held.client?.close();
  }
}

/** Sends one weekly export through the API; answers whether it had the same bytes as an earlier upload. */
async function sendExport(api: V1Client, siteId: string, name: string, text: string): Promise<boolean> {
  const { data, error, response } = await api.POST('/api/v1/sites/{siteId}/files', {
    params: { path: { siteId }, query: { name } },
    body: text,
    bodySerializer: (b) => b,
    headers: { 'content-type': 'text/csv' },
  });
  if (!data) throw apiFailure(`uploading ${name}`, error, response.status);
  return data.duplicateOf !== null;
}

/** How many of the uploads are still waiting to be read or being read, as the API tells. */
async function stillReading(api: V1Client, ids: string[]): Promise<number> {
  let n = 0;
  for (const uploadId of ids) {
    const { data, error, response } = await api.GET('/api/v1/uploads/{uploadId}', { params: { path: { uploadId } } });
    if (!data) throw apiFailure(`asking for upload ${uploadId}`, error, response.status);
    if (data.status === 'queued' || data.status === 'processing' || data.status === 'awaiting-file') n++;
  }
  return n;
}

async function load(opts: LoadOptions, apiOf: (siteId: string) => Promise<V1Client>): Promise<LoadReport> {
  const log = opts.log ?? ((s: string) => console.log(`[demo] ${s}`));
  const siteName = opts.siteName ?? DEMO_SITE_NAME;
  const gen: GenerateOptions = { start: opts.start ?? DEMO_DEFAULTS.start, days: opts.days ?? DEMO_DEFAULTS.days, seed: opts.seed ?? DEMO_DEFAULTS.seed };
  const { startMs, plan } = resolvePlan(gen);
  const pollMs = opts.pollMs ?? 2000;
  const deadline = Date.now() + (opts.waitTimeoutMs ?? 45 * 60_000);
  const model = demoModel();
  model.site.name = siteName;
  const report: LoadReport = {
    siteId: '',
    createdSite: false,
    importedModel: false,
    planned: 0,
    uploaded: [],
    alreadyThere: 0,
    statuses: {},
    unitHours: 0,
    baselines: [],
    notices: 0,
    noticeMails: 0,
    notWaited: [],
  };

  // 1. the site and its model
  const [site] = await db().select({ id: sites.id }).from(sites).where(eq(sites.name, siteName)).limit(1);
  if (site) {
    report.siteId = site.id;
    const [{ n }] = (await db().select({ n: count() }).from(plantUnits).where(eq(plantUnits.siteId, site.id))) as [{ n: number }];
    if (n === 0) {
      const { data, error, response } = await (await apiOf(site.id)).PUT('/api/v1/sites/{siteId}/model', { params: { path: { siteId: site.id } }, body: model });
      if (!data) throw apiFailure('importing the plant model', error, response.status);
      report.importedModel = true;
      log(`plant model imported into '${siteName}': ${model.units.length} units (${model.units.map((u) => u.name).join(', ')})`);
    } else {
      log(`'${siteName}' already has ${n} units: its model is left as it is`);
    }
  } else {
    const created = await createSiteFromModel(model);
    report.siteId = created.siteId;
    report.createdSite = true;
    report.importedModel = true;
    log(`site '${siteName}' created from the model file: ${created.units} units`);
  }
  const siteId = report.siteId;

  // 2. the weekly exports the site does not have yet
  const names = plannedFileNames(gen);
  report.planned = names.length;
  const before = await latestUploads(siteId, names);
  const missing = new Set(names.filter((n) => !IN_HAND.includes(before.get(n)?.status ?? '')));
  report.alreadyThere = names.length - missing.size;
  if (missing.size === 0) {
    log(`all ${names.length} weekly exports are already uploaded`);
  } else {
    log(
      `generating ${gen.days} days of one-minute exports from ${gen.start} (seed ${gen.seed}) and uploading ${missing.size} of ${names.length} weekly files` +
        (report.alreadyThere ? ` (${report.alreadyThere} already there)` : ''),
    );
    const api = await apiOf(siteId);
    let i = 0;
    for (const f of generateExports(gen)) {
      if (!missing.has(f.name)) continue;
      const bytes = Buffer.from(f.text, 'utf8');
      const repeat = await sendExport(api, siteId, f.name, f.text);
      report.uploaded.push(f.name);
      i++;
      log(`uploaded ${f.name} (${(bytes.length / 1e6).toFixed(1)} MB, ${f.rows} rows) ${i}/${missing.size}${repeat ? ' - same bytes as an earlier upload' : ''}`);
    }
  }

  const summarise = async () => {
    const latest = await latestUploads(siteId, names);
    const statuses: Record<string, number> = {};
    for (const u of latest.values()) statuses[u.status] = (statuses[u.status] ?? 0) + 1;
    report.statuses = statuses;
    return latest;
  };

  if (opts.wait === false) {
    await summarise();
    return report;
  }

  // 3. reading and unit hours
  const readWait = await waitUntilZero(
    'files to read',
    async () => {
      const latest = await summarise();
      const open = [...latest.values()].filter((u) => u.status === 'queued' || u.status === 'processing');
      return open.length ? stillReading(await apiOf(siteId), open.map((u) => u.id)) : 0;
    },
    { deadline, pollMs, stallMs: 5 * 60_000, log, progress: (n) => `worker reading: ${names.length - n}/${names.length} files read` },
  );
  if (readWait) report.notWaited.push(readWait);
  const latest = await summarise();
  for (const [name, u] of latest) {
    if (u.status === 'failed') log(`${name} could not be read: ${u.reason}`);
    if (u.status === 'needs-review') log(`${name} waits for a layout review on the uploads page`);
  }
  log(`files: ${Object.entries(report.statuses).map(([s, n]) => `${n} ${s}`).join(', ')}`);

  const engineWait = await waitUntilZero('unit-hour computations', () => pendingJobs(QUEUES.computeUnitHours, QUEUES.computeUnitMonth, QUEUES.computeSettle), {
    deadline,
    pollMs,
    stallMs: 3 * 60_000,
    log,
    progress: (n) => `engine: ${n} unit-hour computation job(s) to go`,
  });
  if (engineWait) report.notWaited.push(engineWait);
  const unitIds = await db().select({ id: plantUnits.id, name: plantUnits.name }).from(plantUnits).where(eq(plantUnits.siteId, siteId)).orderBy(plantUnits.name);
  const [{ uh }] = (await db()
    .select({ uh: count() })
    .from(unitHours)
    .where(inArray(unitHours.unitId, unitIds.length ? unitIds.map((u) => u.id) : ['00000000-0000-0000-0000-000000000000']))) as [{ uh: number }];
  report.unitHours = uh;
  log(`unit hours computed: ${uh}`);

  // 4. baselines on the months before the faults, then the drift check
  // >>> baselines and drift hook (src/server/services/baselines.ts, drift.ts): accepting a baseline queues the drift check
  const admin = await adminUserId();
  const periodFrom = new Date(startMs);
  const periodTo = new Date(Math.min(plan.baselineEndMs, startMs + (gen.days ?? 365) * 86_400_000));
  const referenceHours = (periodTo.getTime() - periodFrom.getTime()) / 3_600_000;
  for (const u of unitIds) {
    const [{ nb }] = (await db().select({ nb: count() }).from(baselines).where(eq(baselines.unitId, u.id))) as [{ nb: number }];
    if (nb > 0) {
      report.baselines.push({ unit: u.name, outcome: 'has a baseline already' });
      continue;
    }
    const [{ ns }] = (await db()
      .select({ ns: count() })
      .from(unitHours)
      .where(and(eq(unitHours.unitId, u.id), eq(unitHours.state, 'steady'), gte(unitHours.hourStart, periodFrom), lt(unitHours.hourStart, periodTo)))) as [{ ns: number }];
    if (ns < MIN_STEADY_SHARE * referenceHours) {
      report.baselines.push({ unit: u.name, outcome: `no baseline: ${ns} steady hours in the reference period, too few to say what normal is (it is idle most of the time)` });
      continue;
    }
    try {
      const draft = await fitDraft(u.id, { periodFrom, periodTo, terms: DEMO_BASELINE_TERMS, note: 'Demo: reference period before the planted faults (docs/demo.md).' }, admin);
      await acceptBaseline(draft.id, admin);
      const cv = draft.destruction.stats.cvRmse;
      report.baselines.push({ unit: u.name, outcome: `baseline v${draft.version} on ${draft.hours} steady hours (destruction CV(RMSE) ${(cv * 100).toFixed(1)} %), drift check on the product's default settings` });
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      report.baselines.push({ unit: u.name, outcome: `no baseline: ${err.message}` });
    }
  }
  for (const b of report.baselines) log(`${b.unit}: ${b.outcome}`);
  log(`reference period ${siteTimeText(periodFrom.getTime()).slice(0, 10)} to ${siteTimeText(periodTo.getTime() - 1).slice(0, 10)}`);
  const driftWait = await waitUntilZero('drift checks', () => pendingJobs(QUEUES.checkDrift), {
    deadline,
    pollMs,
    stallMs: 3 * 60_000,
    log,
    progress: (n) => `drift check: ${n} job(s) to go`,
  });
  if (driftWait) report.notWaited.push(driftWait);
  // <<< baselines and drift hook

  const notices = await db()
    .select({ id: driftNotices.id, kind: driftNotices.kind, unit: plantUnits.name, direction: driftNotices.direction, onset: driftNotices.onsetHour, extra: driftNotices.extra_W })
    .from(driftNotices)
    .innerJoin(plantUnits, eq(plantUnits.id, driftNotices.unitId))
    .where(eq(plantUnits.siteId, siteId))
    .orderBy(driftNotices.onsetHour);
  report.notices = notices.length;
  for (const n of notices) {
    if (n.kind === 'drift') log(`drift notice: ${n.unit} ${n.direction} from ${siteTimeText(n.onset.getTime()).slice(0, 16)}, ${(n.extra / 1000).toFixed(1)} kW extra destruction`);
    else log(`notice (${n.kind === 'idle' ? 'running while idle' : 'limit crossed'}): ${n.unit} from ${siteTimeText(n.onset.getTime()).slice(0, 16)}, ${(n.extra / 1000).toFixed(1)} kW destroyed`);
  }
  if (notices.length) {
    const [{ nm }] = (await db().select({ nm: count() }).from(noticeMails).where(inArray(noticeMails.noticeId, notices.map((n) => n.id)))) as [{ nm: number }];
    report.noticeMails = nm;
    log(`${notices.length} drift notice(s), ${nm} mail(s) queued to energy leads and planners (see the mail inbox)`);
  }
  for (const w of report.notWaited) log(`not waited for: ${w}`);
  return report;
}
