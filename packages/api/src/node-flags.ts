/**
 * Node.js flags for every API process: `npm start` and `npm run dev`, the CLI
 * that seeds the demo region, the API children of the tests and benchmarks
 * (test/support/api-process.ts), and the benchmark process itself (bench/run.ts
 * restarts itself with them), so that what is measured is what serves.
 *
 * Checking a workbook allocates about 57 KB per row, nearly all of it
 * short-lived (exceljs makes objects per XML event, cell and row). On the
 * 100,000-row benchmark workbook, checked and staged inside the API process
 * (figures in DEVELOPERS.md, "Benchmarks"):
 *
 * --no-allocation-site-pretenuring: by default V8 may decide, from what a
 *   process did earlier (loading Sequelize was enough), to allocate some of
 *   those short-lived objects straight into the old generation. Then about
 *   700 KB was promoted per scavenge, each scavenge took about 5 ms instead
 *   of 1.5 ms, and scavenges cost about 1 s of a 6.5 s ingest; without
 *   pretenuring, 0.3 s.
 * --max-semi-space-size=32: V8's default (16 MB) scavenges 1.8 times as
 *   often. The young generation may then hold up to 3 × 32 MB, within the
 *   400 MB peak RSS target for a 200,000-row file.
 */
export const API_NODE_FLAGS: readonly string[] = [
  '--max-semi-space-size=32',
  '--no-allocation-site-pretenuring',
];
