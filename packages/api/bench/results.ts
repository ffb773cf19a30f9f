/**
 * Results and benchmarks at region and national size (the data of
 * bench/national-data.ts, in the test MariaDB), through the production build
 * (dist/) of the services the routes call:
 *
 *   1. full recompute from records (BenchmarkStore.recompute: every current
 *      record of the quarter in one streamed read, every submission's sums
 *      stored, the benchmark built and stored) against the reference read of
 *      the same rows (a bare streamed SELECT, rows as arrays, no type cast),
 *      interleaved run by run; target ≤ 1.5 × the reference at national size,
 *      ≤ 1 s at region size;
 *   2. one more practice confirming: a copy of one practice's current
 *      submission staged as awaiting confirmation (the same records, so the
 *      data stays as generated), confirmed through SubmissionsService.confirm
 *      (its sums computed from its records, the pointer switched), then the
 *      region benchmark's answer for the new set (BenchmarksService.regionAnswer,
 *      the bytes the route sends: the first page of practices, with the region's
 *      figures, as a reader asks first); target: served ≤ 1 s after the
 *      confirm's answer.
 *
 * The quarter is opened for the confirms and closed again afterwards. Run
 * alone with `--variant=region` or `--variant=national` for one size only.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { QueryTypes } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../src/config/config.schema.js';
import { findRepoRoot, loadConfig, loadSecrets } from '../src/config/load-config.js';
import { API_NODE_FLAGS } from '../src/node-flags.js';
import { fromDist } from './app.js';
import { RECORD_COLUMNS } from '../src/database/bulk-load/record-columns.js';
import { type BenchData, ensureBenchData, referenceRead, VARIANTS } from './national-data.js';

export const RESULT_RUNS = 3;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;
const runs = (xs: number[]) => xs.map((x) => x.toFixed(2)).join(', ');

export interface ResultsFigures {
  variant: string;
  recompute: number[];
  reference: number[];
  served: number[];
  confirm: number[];
  sameAsStored: boolean;
}

/** Stages a copy of the practice's current submission (same records), awaiting confirmation. */
export async function stageCopy(data: BenchData, submissionId: number): Promise<number> {
  const db = data.db;
  const [inserted] = await db.query(
    `INSERT INTO submissions (practice_id, quarter_id, status, file_name, file_size_bytes, file_kind,
       uploaded_by_label, uploaded_at, processed_at, rows_total, rows_done, rows_read, rows_accepted,
       rows_rejected, rows_blank, error_count, warning_count, flag_count, file_deleted_at)
     SELECT practice_id, quarter_id, 'awaiting_confirmation', file_name, file_size_bytes, file_kind,
            'benchmark', NOW(3), NOW(3), rows_total, rows_done, rows_read, rows_accepted,
            rows_rejected, rows_blank, error_count, warning_count, flag_count, NOW(3)
       FROM submissions WHERE id = ?`,
    { replacements: [submissionId], type: QueryTypes.INSERT },
  );
  const copy = Number(inserted);
  const columns = RECORD_COLUMNS.filter((c) => c !== 'submission_id');
  await db.query(
    `INSERT INTO care_records (submission_id, ${columns.join(', ')})
     SELECT ?, ${columns.join(', ')} FROM care_records WHERE submission_id = ?`,
    { replacements: [copy, submissionId], type: QueryTypes.INSERT },
  );
  return copy;
}

export async function measureResults(
  config: CairnConfig,
  secrets: CairnSecrets,
  name: 'region' | 'national',
  log: (line: string) => void,
): Promise<ResultsFigures> {
  const v = VARIANTS[name];
  const data = await ensureBenchData(config, secrets, v, log);
  const named: CairnConfig = { ...config, database: { ...config.database, name: v.database } };
  const { createApp } = await fromDist('app.factory.js');
  const { createRootLogger } = await fromDist('common/logger.js');
  const { systemActor } = await fromDist('auth/actor.js');
  const app = await createApp({ config: named, secrets, logger: createRootLogger('silent') });
  await app.init();
  const service = async (path: string, cls: string) => app.get((await fromDist(path))[cls]);
  try {
    const store = await service('benchmarks/benchmark-store.service.js', 'BenchmarkStore');
    const benchmarks = await service('benchmarks/benchmarks.service.js', 'BenchmarksService');
    const submissions = await service('submissions/submissions.service.js', 'SubmissionsService');
    const quarters = await service('quarters/quarters.service.js', 'QuartersService');
    const quarter = await quarters.find(data.quarterId);
    const actor = systemActor('benchmark', quarter.regionId);

    // 1. Full recompute against the reference read, after one untimed of each.
    await referenceRead(config, secrets, data);
    let sameAsStored = true;
    const check = (r: { body: Buffer | null; stored: Buffer | null }) => {
      if (!r.body || !r.stored || !r.body.equals(r.stored)) sameAsStored = false;
    };
    check(await store.recompute(quarter));
    const recompute: number[] = [];
    const reference: number[] = [];
    for (let run = 0; run < RESULT_RUNS; run++) {
      reference.push((await referenceRead(config, secrets, data)).seconds);
      const t0 = performance.now();
      check(await store.recompute(quarter));
      recompute.push((performance.now() - t0) / 1000);
    }

    // 2. One more practice confirming, then the region's benchmark served for the new set.
    await data.db.query("UPDATE audit_quarters SET status = 'open' WHERE id = ?", {
      replacements: [quarter.id],
      type: QueryTypes.UPDATE,
    });
    const served: number[] = [];
    const confirm: number[] = [];
    try {
      for (let run = 0; run < RESULT_RUNS; run++) {
        const [pick] = await data.db.query<{ practice_id: number; current_submission_id: number }>(
          `SELECT pq.practice_id, pq.current_submission_id FROM practice_quarters pq
             JOIN practices p ON p.id = pq.practice_id
            WHERE pq.quarter_id = ? ORDER BY p.code LIMIT 1 OFFSET ?`,
          { replacements: [quarter.id, run], type: QueryTypes.SELECT },
        );
        const copy = await stageCopy(data, Number(pick!.current_submission_id));
        // A running server has served the current set already (its first page, as a reader asks).
        const before = JSON.parse(
          (await benchmarks.regionAnswer(actor, quarter.id, {})).plain.toString('utf8'),
        );
        const t0 = performance.now();
        await submissions.confirm(actor, Number(pick!.practice_id), copy);
        const t1 = performance.now();
        // What the route sends: the stored answer's bytes (read back here only to check them).
        const answer = await benchmarks.regionAnswer(actor, quarter.id, {});
        const t2 = performance.now();
        const after = JSON.parse(answer.plain.toString('utf8'));
        if (after.builtFrom.submissionsKey === before.builtFrom.submissionsKey) {
          throw new Error('the benchmark served after the confirm is not of the new set');
        }
        if (after.builtFrom.submissions !== v.practices) {
          throw new Error(`the new set has ${after.builtFrom.submissions} submissions`);
        }
        confirm.push((t1 - t0) / 1000);
        served.push((t2 - t1) / 1000);
      }
    } finally {
      await data.db.query("UPDATE audit_quarters SET status = 'closed' WHERE id = ?", {
        replacements: [quarter.id],
        type: QueryTypes.UPDATE,
      });
    }
    return { variant: name, recompute, reference, served, confirm, sameAsStored };
  } finally {
    await app.close();
    await data.db.close();
  }
}

/** The section of `npm run bench`; returns false when a target is missed. */
export async function runResultsBench(
  config: CairnConfig,
  secrets: CairnSecrets,
  log: (line: string) => void = console.log,
): Promise<boolean> {
  let ok = true;
  const judge = (met: boolean, label: string) => {
    log(`  ${met ? 'met   ' : 'MISSED'} ${label}`);
    if (!met) ok = false;
  };
  const only = process.argv.find((a) => a.startsWith('--variant='))?.slice('--variant='.length);
  for (const name of (['region', 'national'] as const).filter((n) => !only || n === only)) {
    const f = await measureResults(config, secrets, name, log);
    const rec = median(f.recompute);
    const ref = median(f.reference);
    const served = median(f.served);
    log(`  ${name}: median of ${RESULT_RUNS} runs`);
    log(
      `    full recompute from records   ${rec.toFixed(2).padStart(6)} s   (runs: ${runs(f.recompute)} s)`,
    );
    log(
      `    reference streamed SELECT     ${ref.toFixed(2).padStart(6)} s   (runs: ${runs(f.reference)} s)`,
    );
    log(`    recompute / reference         × ${(rec / ref).toFixed(2)}`);
    log(
      `    confirm (sums of ~${Math.round(VARIANTS[name].meanRecords)} records, switch)  ${median(f.confirm).toFixed(2)} s   (runs: ${runs(f.confirm)} s)`,
    );
    log(
      `    confirm's answer → new result served  ${served.toFixed(2)} s   (runs: ${runs(f.served)} s)`,
    );
    judge(f.sameAsStored, `${name}: the recompute's bytes equal the stored result's`);
    if (name === 'national') {
      judge(
        rec / ref <= 1.5,
        `national full recompute ≤ 1.5 × the reference read (× ${(rec / ref).toFixed(2)})`,
      );
      judge(
        served <= 1,
        `national: new result served ≤ 1 s after the confirm (${served.toFixed(2)} s)`,
      );
    } else {
      judge(rec <= 1, `region full recompute ≤ 1 s (${rec.toFixed(2)} s)`);
    }
  }
  return ok;
}

if (
  process.argv[1] === fileURLToPath(import.meta.url) &&
  !API_NODE_FLAGS.every((flag) => process.execArgv.includes(flag))
) {
  // Run alone: with the API process's own Node flags, as run.ts runs every section.
  const again = spawnSync(
    process.execPath,
    [...API_NODE_FLAGS, ...process.execArgv, ...process.argv.slice(1)],
    { stdio: 'inherit' },
  );
  process.exit(again.status ?? 1);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  // Run alone: the test profile, and the test secrets left by `npm run db:start -- --profile test`.
  process.env.CAIRN_PROFILE = 'test';
  const file = join(findRepoRoot(), '.data', 'secrets-test.json');
  if (!process.env.CAIRN_DATABASE_PASSWORD && existsSync(file)) {
    const stored = JSON.parse(readFileSync(file, 'utf8')) as Record<string, string>;
    for (const [name, value] of Object.entries(stored)) process.env[name] ??= value;
  }
  const ok = await runResultsBench(loadConfig({ profile: 'test' }), loadSecrets());
  process.exitCode = ok ? 0 : 1;
}
