/** @cairn/metrics: Cairn's metrics engine (pure TypeScript, no I/O). */
export const METRICS_PACKAGE = '@cairn/metrics';
