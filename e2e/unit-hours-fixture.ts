import pg from 'pg';

/** A suffix that keeps the names of one run's invented sites apart. */
export const stamp = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;

/**
 * An invented site in UTC (currency GBP) with one turbine named `unitName` and `hours` steady unit
 * hours from `first`, written as the engine would: a load swinging between 0.3 and 0.9, fuel, product
 * and destruction in proportion to it. Returns the ids.
 */
export async function turbineWithHours(siteName: string, unitName: string, first: string, hours: number): Promise<{ siteId: string; unitId: string }> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    const siteId = (await client.query<{ id: string }>(`insert into sites (name, time_zone, currency) values ($1, 'UTC', 'GBP') returning id`, [siteName])).rows[0]!.id;
    const unitId = (await client.query<{ id: string }>(`insert into plant_units (site_id, name, kind) values ($1, $2, 'turbine') returning id`, [siteId, unitName])).rows[0]!.id;
    await client.query(
      `insert into unit_hours (unit_id, hour_start, state, reasons, load, load_unit, t0_k, fuel_w, product_w, loss_w, destruction_w,
         efficiency, efficiency_u, destruction_u_w, destruction_cost_per_h, model_version, inputs_hash)
       select $1, $2::timestamptz + i * interval '1 hour', 'steady', '[]'::jsonb, l, '-', 290, 4e6 * l, 3e6 * l, 0, 1e6 * l,
         0.75, 0.01, 2e4, 30 * l, 'e2e', md5(i::text)
       from generate_series(0, $3 - 1) i, lateral (select 0.6 + 0.3 * sin(i / 5.0) as l) a`,
      [unitId, first, hours],
    );
    return { siteId, unitId };
  } finally {
    await client.end();
  }
}
