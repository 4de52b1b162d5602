import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { expect, test } from '@playwright/test';
import { DEMO, letDownValveModel, signIn } from './helpers';

const run = promisify(execFile);
const CLIENT = 'clients/python/lossline_client.py';
const HOUR = 3_600_000;
const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;

/**
 * An invented let-down valve's export: three hours of one-minute readings (60 bar(a), 485 degC,
 * 7.2 t/h in; 4 bar(g) out), wide layout with ISO times, as a site's scheduled job would send it.
 */
function exportFile(firstHour: number): string {
  const lines = ['Time,PYC_IN_P,PYC_IN_T,PYC_F,PYC_OUT_P'];
  for (let m = 0; m < 180; m++) {
    const t = new Date(firstHour + m * 60_000).toISOString();
    const wobble = Math.sin(m / 7) * 0.002;
    lines.push(`${t},${(60 * (1 + wobble)).toFixed(3)},${(485 + wobble * 100).toFixed(2)},${(7.2 * (1 + wobble)).toFixed(4)},3.98675`);
  }
  return lines.join('\n') + '\n';
}

async function client(env: Record<string, string>, args: string[]) {
  try {
    const out = await run('python3', [CLIENT, ...args], { env: { ...process.env, ...env }, timeout: 120_000 });
    return { code: 0, stdout: out.stdout, stderr: out.stderr };
  } catch (e) {
    const err = e as { code?: number; stdout?: string; stderr?: string };
    return { code: err.code ?? -1, stdout: err.stdout ?? '', stderr: err.stderr ?? '' };
  }
}

test('a site script sends an export with the Python client, waits for it and fetches the unit hours as CSV', async ({ page, baseURL }) => {
  test.setTimeout(150_000);
  const unitName = `PRV ${stamp()}`;
  await signIn(page, DEMO.admin);
  const created = await page.request.post('/api/sites/from-model', {
    data: letDownValveModel(`Python client site ${stamp()}`, unitName, { inP: 'PYC_IN_P', inT: 'PYC_IN_T', flow: 'PYC_F', outP: 'PYC_OUT_P' }),
  });
  expect(created.status()).toBe(201);
  const siteId = (await created.json()).siteId as string;
  const units = await (await page.request.get(`/api/sites/${siteId}/units`)).json();
  const unitId = (units.units ?? units).find((u: { name: string }) => u.name === unitName).id as string;
  const issued = await page.request.post(`/api/sites/${siteId}/tokens`, { data: { name: 'nightly export (python)', role: 'operator' } });
  expect(issued.status()).toBe(201);
  const env = { LOSSLINE_URL: baseURL!, LOSSLINE_TOKEN: (await issued.json()).token as string };

  const firstHour = Math.floor(Date.now() / HOUR) * HOUR - 8 * HOUR;
  const dir = mkdtempSync(join(tmpdir(), 'lossline-pyclient-'));
  const file = join(dir, `pyc-${stamp()}.csv`);
  writeFileSync(file, exportFile(firstHour));

  const sent = await client(env, ['upload', '--site', siteId, file, '--wait']);
  expect(sent.stderr).toBe('');
  expect(sent.code).toBe(0);
  const status = JSON.parse(sent.stdout);
  expect(status.status).toBe('done');
  expect(status.summary.rows).toBe(180);

  // The worker computes the unit's hours after the file; the script polls the CSV until all three are there.
  const from = new Date(firstHour).toISOString();
  const to = new Date(firstHour + 3 * HOUR).toISOString();
  let rows: Record<string, string>[] = [];
  await expect
    .poll(async () => {
      const got = await client(env, ['hours', '--unit', unitId, '--from', from, '--to', to]);
      if (got.code !== 0) return `exit ${got.code}: ${got.stderr}`;
      const [header, ...lines] = got.stdout.trim().split(/\r?\n/);
      if (header === undefined) return 'no header line';
      const cols = header.split(',');
      rows = lines.filter(Boolean).map((l) => Object.fromEntries(l.split(',').map((v, i) => [cols[i], v])));
      return rows.length;
    }, { timeout: 90_000, intervals: [1000, 2000] })
    .toBe(3);
  for (const row of rows) {
    // A throttling valve destroys exergy and makes no product: D = F > 0, P empty (docs/api.md).
    expect(Number(row.destruction_W)).toBeGreaterThan(0);
    expect(Number(row.destruction_W)).toBeCloseTo(Number(row.fuel_W), 0);
    expect(row.product_W).toBe('');
  }

  // A bad request comes back as the one error shape: the client prints the stable code and exits 2.
  const bad = await client(env, ['hours', '--unit', unitId, '--from', 'yesterday', '--to', to]);
  expect(bad.code).toBe(2);
  expect(bad.stderr).toMatch(/^lossline: 400 [A-Z_]+: /);
});

/**
 * Runs the client's command line (`_main`) with its site_state calls recorded in `trace` (a JSON
 * list of every state it read), so a test can see what it waited on; stdout, stderr and the exit
 * status are the command's own.
 */
const TRACED = `
import json, os, sys
sys.path.insert(0, os.path.dirname(os.environ["CLIENT"]))
import lossline_client as lc
seen = []
plain = lc.LosslineClient.site_state
def traced(self, site_id):
    state = plain(self, site_id)
    seen.append(state)
    return state
lc.LosslineClient.site_state = traced
code = lc._main(sys.argv[1:])
with open(os.environ["TRACE"], "w") as f:
    json.dump(seen, f)
sys.exit(code)
`;

test('upload --settle returns once the site state says settled, with every hour of the file computed, and exits 0', async ({ page, baseURL }) => {
  test.setTimeout(150_000);
  const unitName = `PRV ${stamp()}`;
  await signIn(page, DEMO.admin);
  const created = await page.request.post('/api/sites/from-model', {
    data: letDownValveModel(`Python settle site ${stamp()}`, unitName, { inP: 'PYS_IN_P', inT: 'PYS_IN_T', flow: 'PYS_F', outP: 'PYS_OUT_P' }),
  });
  expect(created.status()).toBe(201);
  const { siteId, unitIds } = (await created.json()) as { siteId: string; unitIds: Record<string, { id: string }> };
  const unitId = unitIds[unitName]!.id;
  const issued = await page.request.post(`/api/sites/${siteId}/tokens`, { data: { name: 'nightly export (settle)', role: 'operator' } });
  expect(issued.status()).toBe(201);
  const token = (await issued.json()).token as string;
  const dir = mkdtempSync(join(tmpdir(), 'lossline-pysettle-'));
  const env = { LOSSLINE_URL: baseURL!, LOSSLINE_TOKEN: token, CLIENT, TRACE: join(dir, 'states.json') };

  const firstHour = Math.floor(Date.now() / HOUR) * HOUR - 8 * HOUR;
  const file = join(dir, `pys-${stamp()}.csv`);
  writeFileSync(file, exportFile(firstHour).replaceAll('PYC_', 'PYS_'));

  let sent: { code: number; stdout: string; stderr: string };
  try {
    const out = await run('python3', ['-c', TRACED, 'upload', '--site', siteId, file, '--settle'], { env: { ...process.env, ...env }, timeout: 120_000 });
    sent = { code: 0, stdout: out.stdout, stderr: out.stderr };
  } catch (e) {
    const err = e as { code?: number; stdout?: string; stderr?: string };
    sent = { code: err.code ?? -1, stdout: err.stdout ?? '', stderr: err.stderr ?? '' };
  }
  expect(sent.stderr).toBe('');
  expect(sent.code).toBe(0);
  expect(JSON.parse(sent.stdout).status).toBe('done');

  // It read the site's state until it said settled, and returned at the first state that did.
  const states = JSON.parse(readFileSync(env.TRACE, 'utf8')) as { siteId: string; settled: boolean }[];
  expect(states.length).toBeGreaterThan(0);
  expect(states.map((s) => s.settled)).toEqual([...states.slice(1).map(() => false), true]);
  expect(states.every((s) => s.siteId === siteId)).toBe(true);

  // Right after it returned, without waiting here: the site is settled and the file's three hours are computed.
  const state = await (await page.request.get(`/api/v1/sites/${siteId}/state`, { headers: { Authorization: `Bearer ${token}` } })).json();
  expect(state.settled).toBe(true);
  expect(state.files).toMatchObject({ waiting: 0, reading: 0 });
  expect(state.compute).toEqual({ waiting: 0, active: 0 });
  expect(state.latestComputedHour).toBe(new Date(firstHour + 2 * HOUR).toISOString());
  const hours = await client(env, ['hours', '--unit', unitId, '--from', new Date(firstHour).toISOString(), '--to', new Date(firstHour + 3 * HOUR).toISOString()]);
  expect(hours.code).toBe(0);
  expect(hours.stdout.trim().split(/\r?\n/).slice(1).filter(Boolean)).toHaveLength(3);
});
