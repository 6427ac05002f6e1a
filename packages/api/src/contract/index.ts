/**
 * The request and response schemas that the API and the web share. The web imports this
 * module as `@rolloff/api/contract` and never re-declares an API type by hand.
 */
export * from './health.js';
