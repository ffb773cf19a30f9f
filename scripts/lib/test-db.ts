/**
 * The disposable MariaDB instance of `npm test` (.data/mariadb-test, its own
 * port). Several test runs may overlap (two terminals, two engineers): each
 * holds a lease while it runs, and the last one to finish shuts it down.
 */
import {
  closeSync,
  existsSync,
  mkdirSync,
  openSync,
  readFileSync,
  readdirSync,
  rmSync,
  unlinkSync,
  writeFileSync,
} from 'node:fs';
import { join } from 'node:path';
import type { Context } from './context.ts';
import {
  ensureDatabaseAndUser,
  ensureDataDir,
  ensureMariadbBinaries,
  type MariadbBinaries,
  startMariadb,
  stopMariadb,
} from './mariadb.ts';
import { isProcessAlive, sleep } from './proc.ts';

async function withLock<T>(lockFile: string, fn: () => Promise<T>): Promise<T> {
  for (let attempt = 0; ; attempt++) {
    try {
      const fd = openSync(lockFile, 'wx');
      writeFileSync(fd, String(process.pid));
      closeSync(fd);
      break;
    } catch {
      let holder = Number.NaN;
      try {
        holder = Number.parseInt(readFileSync(lockFile, 'utf8'), 10);
      } catch {
        // removed in between: try again
      }
      const dead = Number.isInteger(holder) && !isProcessAlive(holder);
      if (dead || attempt > 600) {
        rmSync(lockFile, { force: true });
        continue;
      }
      await sleep(100);
    }
  }
  try {
    return await fn();
  } finally {
    rmSync(lockFile, { force: true });
  }
}

export interface TestDatabase {
  bin: MariadbBinaries;
  release(): Promise<void>;
}

export async function acquireTestDatabase(ctx: Context): Promise<TestDatabase> {
  const bin = await ensureMariadbBinaries();
  const runDir = join(ctx.root, '.data', 'run');
  const leases = join(runDir, 'mariadb-test.leases');
  mkdirSync(leases, { recursive: true });
  const lockFile = join(runDir, 'mariadb-test.lock');
  const myLease = join(leases, String(process.pid));

  await withLock(lockFile, async () => {
    writeFileSync(myLease, new Date().toISOString());
    ensureDataDir(bin, ctx.mariadb);
    await startMariadb(bin, ctx.mariadb, { removeStalePid: true });
    ensureDatabaseAndUser(bin, ctx.mariadb, {
      database: ctx.config.database.name,
      user: ctx.config.database.user,
      password: ctx.secrets.CAIRN_DATABASE_PASSWORD,
      allowPrefix: true,
    });
  });

  return {
    bin,
    release: () =>
      withLock(lockFile, async () => {
        if (existsSync(myLease)) unlinkSync(myLease);
        const others = readdirSync(leases).filter((pid) => {
          const alive = isProcessAlive(Number(pid));
          if (!alive) rmSync(join(leases, pid), { force: true });
          return alive;
        });
        if (others.length === 0) await stopMariadb(bin, ctx.mariadb);
      }),
  };
}
