import { defineMiddleware } from 'astro:middleware';
import { guard } from './server/guard';

/** Session lookup and the role guard of src/server/policy.ts, for every request. */
export const onRequest = defineMiddleware((context, next) => guard(context, next));
