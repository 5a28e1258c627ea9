/**
 * What `import "server-only"` resolves to under vitest (vitest.config.ts aliases it here). The
 * package throws outside React's server environment, which is the point in the app's bundles;
 * tests import server modules directly and need it empty.
 */
export {};
