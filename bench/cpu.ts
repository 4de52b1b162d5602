/**
 * CPU time of the processes an end-to-end run uses (the worker, the PostgreSQL cluster, the S3 fake,
 * this process), read from /proc. On a shared machine the wall-clock figures move with the load;
 * the CPU seconds say where the work goes regardless.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { db } from '~/server/db/client';

const TICK_S = 0.01; // USER_HZ is 100 on Linux

/** utime + stime of a process and its waited-for children [s], or 0 when it is gone. */
function cpuOf(pid: number): number {
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    return (Number(f[11]) + Number(f[12]) + Number(f[13]) + Number(f[14])) * TICK_S;
  } catch {
    return 0;
  }
}

function pids(): { pid: number; ppid: number; cmd: string }[] {
  const out: { pid: number; ppid: number; cmd: string }[] = [];
  for (const d of readdirSync('/proc')) {
    if (!/^\d+$/.test(d)) continue;
    try {
      const stat = readFileSync(`/proc/${d}/stat`, 'utf8');
      const ppid = Number(stat.split(') ')[1]!.split(' ')[1]);
      out.push({ pid: Number(d), ppid, cmd: readFileSync(`/proc/${d}/cmdline`, 'utf8').replace(/\0/g, ' ') });
    } catch {
      // gone meanwhile
    }
  }
  return out;
}

export interface CpuGroups {
  worker: number[];
  postgres: number[];
  store: number[];
}

/** The PostgreSQL cluster's processes (postmaster and its children) and the S3 fake on S3_ENDPOINT's port. */
export async function cpuGroups(workerPid: number): Promise<CpuGroups> {
  const dir = (await db().execute<{ d: string }>(sql`select current_setting('data_directory') as d`)).rows[0]!.d;
  const postmaster = Number(readFileSync(`${dir}/postmaster.pid`, 'utf8').split('\n')[0]);
  const port = new URL(process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4569').port;
  const all = pids();
  return {
    worker: [workerPid],
    postgres: [postmaster, ...all.filter((p) => p.ppid === postmaster).map((p) => p.pid)],
    store: all.filter((p) => p.cmd.includes('fakes/s3.ts') && p.cmd.includes(`--port ${port}`)).map((p) => p.pid),
  };
}

/** CPU seconds per process of each group. */
export type CpuSnapshot = { groups: Record<keyof CpuGroups, Map<number, number>>; bench: number };

export function cpuSnapshot(g: CpuGroups): CpuSnapshot {
  const of = (ps: number[]) => new Map(ps.map((p) => [p, cpuOf(p)]));
  const own = process.cpuUsage();
  return { groups: { worker: of(g.worker), postgres: of(g.postgres), store: of(g.store) }, bench: (own.user + own.system) / 1e6 };
}

/**
 * CPU seconds each group spent between two snapshots (processes that began in between count from
 * zero; backends that ended are in the postmaster's children's time).
 */
export function cpuSince(a: CpuSnapshot, b: CpuSnapshot): string {
  const parts = (Object.keys(b.groups) as (keyof CpuGroups)[]).map((k) => {
    let s = 0;
    for (const [pid, t] of b.groups[k]) s += t - (a.groups[k].get(pid) ?? 0);
    return `${k} ${s.toFixed(2)}`;
  });
  return [...parts, `bench ${(b.bench - a.bench).toFixed(2)}`].join(', ');
}
