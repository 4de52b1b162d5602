import type PgBoss from 'pg-boss';

/** Job handlers beyond mail; each capability registers its queue here. */
export async function registerHandlers(_boss: PgBoss): Promise<void> {}
