/**
 * Rate limits of /api/v1: per API token and per signed-in person, API_RATE_LIMIT_PER_MINUTE requests
 * a minute (default 6000, far above what the demo loader, the Python client and the tests send; 0
 * turns the limit off). Beyond it the answer is 429 RATE_LIMITED in the one error shape, with
 * Retry-After in seconds. Counted in memory by rate-limiter-flexible, per web process: behind a load
 * balancer with n processes a caller may get up to n times the limit (docs/api.md, "Rate limits").
 */
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from './env';
import { apiError } from './errors';

let limiter: { points: number; memory: RateLimiterMemory } | null = null;

function limiterFor(points: number): RateLimiterMemory {
  if (!limiter || limiter.points !== points) limiter = { points, memory: new RateLimiterMemory({ points, duration: 60 }) };
  return limiter.memory;
}

/** The caller's key: its token, else the person; null for an anonymous call (refused by the guard anyway). */
export function rateKey(locals: App.Locals): string | null {
  if (locals.apiToken) return `token:${locals.apiToken.id}`;
  if (locals.user) return `user:${locals.user.id}`;
  return null;
}

/** Counts one request of the caller: null when it may go on, else the 429 answer with Retry-After. */
export async function checkApiRate(key: string, points = env().API_RATE_LIMIT_PER_MINUTE): Promise<Response | null> {
  if (points <= 0) return null;
  try {
    await limiterFor(points).consume(key);
    return null;
  } catch (res) {
    if (!(res instanceof RateLimiterRes)) throw res;
    const seconds = Math.max(1, Math.ceil(res.msBeforeNext / 1000));
    const who = key.startsWith('token:') ? 'this API token' : 'you';
    const answer = apiError('RATE_LIMITED', `Too many requests from ${who}: at most ${points} a minute to /api/v1. Try again in ${seconds} s (Retry-After).`);
    answer.headers.set('Retry-After', String(seconds));
    return answer;
  }
}
