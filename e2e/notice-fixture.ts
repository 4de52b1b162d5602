import pg from 'pg';

/**
 * An invented site with a turbine, an active baseline, `hours` drift points from `first` (written as
 * the drift check would: a residual that steps up at the onset, the upward sum growing until it signals)
 * and one open drift notice whose chart spans `chartHours` hours (its onset, signals and latest figures
 * placed so that onset - 72 h to the end + 72 h covers them). Returns the ids.
 */
export async function noticeWithChart(name: string, opts: { first?: string; hours?: number; chartHours?: number } = {}) {
  const first = Date.parse(opts.first ?? '2025-06-02T00:00:00Z');
  const hours = opts.hours ?? 24 * 30;
  const chartHours = opts.chartHours ?? 330;
  const H = 3_600_000;
  const onset = first + 240 * H;
  const end = onset - 72 * H + chartHours * H - 72 * H; // the chart: onset - 72 h .. end + 72 h
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const siteId = (await client.query<{ id: string }>(`insert into sites (name, time_zone, currency) values ($1, 'Europe/London', 'GBP') returning id`, [name])).rows[0]!.id;
    const unitId = (await client.query<{ id: string }>(`insert into plant_units (site_id, name, kind) values ($1, 'Chart turbine', 'turbine') returning id`, [siteId])).rows[0]!.id;
    const baselineId = (
      await client.query<{ id: string }>(
        `insert into baselines (unit_id, version, status, period_from, period_to, terms, hours, destruction_model)
         values ($1, 1, 'active', $2, $3, '["load"]'::jsonb, 168, $4::jsonb) returning id`,
        [unitId, new Date(first - 14 * 24 * H).toISOString(), new Date(first - 7 * 24 * H).toISOString(), JSON.stringify(flatModel())],
      )
    ).rows[0]!.id;
    const onsetStep = 240;
    await client.query(
      `insert into drift_points (unit_id, hour_start, baseline_id, step, destruction_w, expected_w, residual_w, x, c_plus, c_minus, n_plus, n_minus, signal, destruction_u_w)
       select $1, $3::timestamptz + i * interval '1 hour', $2, i + 1, 1.2e6 + r, 1.2e6, r, r / 2.1e4, cp, 0, 0, 0,
         case when cp >= 5 and i % 24 = 0 then 'up' end, 1.7e4
       from generate_series(0, $4 - 1) i,
         lateral (select 2.1e4 * sin(i * 1.7) + 6.3e3 * cos(i * 0.31) + case when i >= $5 then 3.9e4 else 0 end as r) a,
         lateral (select case when i >= $5 then least(1.37 * (i - $5) + 0.1 * sin(i), 9.9) else abs(0.4 * sin(i / 3.0)) end as cp) b`,
      [unitId, baselineId, new Date(first).toISOString(), hours, onsetStep],
    );
    const noticeId = (
      await client.query<{ id: string }>(
        `insert into drift_notices (site_id, unit_id, baseline_id, direction, onset_hour, signal_hour, last_signal_hour, figures_hour, hours, extra_w, expected_w, shift_sigma, currency, k, h)
         values ($1, $2, $3, 'up', $4, $5, $6, $6, 5, 39012.345678, 1200000, 1.857, 'GBP', 0.5, 5) returning id`,
        [siteId, unitId, baselineId, new Date(onset).toISOString(), new Date(onset + 5 * H).toISOString(), new Date(end).toISOString()],
      )
    ).rows[0]!.id;
    return { siteId, unitId, noticeId };
  } finally {
    await client.end();
  }
}

/**
 * A whole destruction model as a fit would store it (every field the pages read), invented for the
 * fixture: 1.2 MW whatever the load, a residual spread of 21 kW over 168 hours. A row with an empty
 * model is not one the product can write, and the baselines page rightly expects its statistics.
 */
function flatModel() {
  const n = 168;
  const p = 2;
  const s = 2.1e4;
  const ybar = 1.2e6;
  return {
    terms: ['load'],
    centre: { load: 0.8, T_amb_K: 288.15 },
    scale: { load: 0.1, T_amb_K: 5 },
    beta: [ybar, 0],
    zTzInv: [[1 / n, 0], [0, 1 / n]],
    coefficients: { intercept: ybar, load: 0 },
    stats: { n, p, dof: n - p, sse: s * s * (n - p), s, r2: 0, ybar, cvRmse: s / ybar, nmbe: 0 },
  };
}
