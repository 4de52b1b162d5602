/**
 * .astro files imported by tests (rendered through Astro's container, e.g. tests/views/overview-kept.test.ts)
 * are components to tsc; vite compiles them with Astro's plugin when the tests run.
 */
declare module '*.astro' {
  const Component: import('astro/runtime/server/index.js').AstroComponentFactory;
  export default Component;
}
