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
 * --max-semi-space-size=48: V8's default (16 MB) scavenges 1.8 times as
 *   often as 32 MB does. Staging rows while reading keeps more objects alive
 *   at each scavenge than reading alone (about twice as many bytes promoted),
 *   and 48 MB gives them room to die young: in runs of a bare read then an
 *   ingest of the 100,000-row workbook, the ingest took 3.7–4.1 s against
 *   4.1–4.6 s at 32 MB, the bare read the same. The peak RSS ingesting a
 *   200,000-row file was 374–389 MB (315 MB at 32 MB), within the 400 MB
 *   target; 40 and 64 MB were neither faster nor smaller.
 */
export const API_NODE_FLAGS: readonly string[] = [
  '--max-semi-space-size=48',
  '--no-allocation-site-pretenuring',
];
