/**
 * Energy-gap trace files: the strict streaming parser, gzip-aware reading, the two-pass streaming
 * analysis and seeded synthetic traces. Shared by the API (uploads, the analysis job, the demo
 * seed) and the `gapwise traces` command. Node-side only (streams, zlib, temporary files); imports
 * no framework, no database and no app. Import it only as `@gapwise/traces`.
 */
export * from './trace-parser';
export * from './trace-stream';
export * from './trace-analysis';
export * from './synthetic-trace';
