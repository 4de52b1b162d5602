import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { heapGrowingPercent } from '~/worker/heap';

describe('the worker heap growing setting', () => {
  it('is 50 percent unless the environment says otherwise', () => {
    expect(heapGrowingPercent({})).toBe(50);
    expect(heapGrowingPercent({ WORKER_HEAP_GROWING_PERCENT: '' })).toBe(50);
    expect(heapGrowingPercent({ WORKER_HEAP_GROWING_PERCENT: '30' })).toBe(30);
    expect(heapGrowingPercent({ WORKER_HEAP_GROWING_PERCENT: '0' })).toBe(0);
  });

  it('refuses what is no whole percent, naming the setting', () => {
    for (const bad of ['-1', '1.5', 'fifty', '1001']) {
      expect(() => heapGrowingPercent({ WORKER_HEAP_GROWING_PERCENT: bad })).toThrow(/WORKER_HEAP_GROWING_PERCENT must be a whole number/);
    }
  });

  it('stops a worker started with a bad value before it serves', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', '-e', "await import('./src/worker/heap.ts'); console.log('loaded')"], {
      env: { ...process.env, WORKER_HEAP_GROWING_PERCENT: 'lots' },
      encoding: 'utf8',
    });
    expect(r.status).not.toBe(0);
    expect(r.stderr).toMatch(/WORKER_HEAP_GROWING_PERCENT must be a whole number/);
    expect(r.stdout).not.toMatch(/loaded/);
  });
});
