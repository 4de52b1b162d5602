/**
 * The web server's old entry, kept for commands that still say `node --import tsx scripts/serve.ts`:
 * it runs scripts/serve.mjs (npm start), but with tsx's ESM hooks registered, which makes each
 * request dearer (README, "Many users at once"). Use `npm start` / `node scripts/serve.mjs`.
 */
await import('./serve.mjs');
export {};
