/** @cairn/metrics: Cairn's metrics engine (pure TypeScript, no I/O). */
export const METRICS_PACKAGE = '@cairn/metrics';

export * from './records/record.js';
export * from './records/month.js';
export * from './records/columns.js';
