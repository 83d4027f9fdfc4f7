/**
 * Dropwise power rules — pure TypeScript, shared by the phone (offline) and the server.
 * No UI, no database, no network, no platform imports.
 */
export * from './units';
export * from './standards';
export * from './model';
export * from './rules';
export { demoSite, demoSiteInput } from './demo-site';
