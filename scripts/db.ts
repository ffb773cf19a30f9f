/**
 * `npm run db:start | db:stop | db:status [-- --profile test]`: the private
 * MariaDB on its own, for working on the API with `npm run dev`.
 */
import { loadContext } from './lib/context.ts';
import { fail, log, runMain } from './lib/log.ts';
import {
  ensureDatabaseAndUser,
  ensureDataDir,
  ensureMariadbBinaries,
  instanceState,
  startMariadb,
  stopMariadb,
} from './lib/mariadb.ts';

async function main(): Promise<void> {
  const [command, ...rest] = process.argv.slice(2);
  const profileIndex = rest.indexOf('--profile');
  const profile = profileIndex >= 0 ? rest[profileIndex + 1] : 'development';
  if (profile !== 'development' && profile !== 'test')
    fail('--profile must be development or test');
  const ctx = loadContext(profile);
  const bin = await ensureMariadbBinaries();
  switch (command) {
    case 'start': {
      ensureDataDir(bin, ctx.mariadb);
      await startMariadb(bin, ctx.mariadb, { removeStalePid: profile === 'test' });
      ensureDatabaseAndUser(bin, ctx.mariadb, {
        database: ctx.config.database.name,
        user: ctx.config.database.user,
        password: ctx.secrets.CAIRN_DATABASE_PASSWORD,
        allowPrefix: profile === 'test',
      });
      log.ok(
        `MariaDB (${profile}) running on 127.0.0.1:${ctx.config.database.port}; stop it with npm run db:stop${profile === 'test' ? ' -- --profile test' : ''}`,
      );
      break;
    }
    case 'stop': {
      const state = instanceState(bin, ctx.mariadb);
      if (state.kind !== 'running') {
        log.ok(`MariaDB (${profile}) is not running`);
        break;
      }
      await stopMariadb(bin, ctx.mariadb);
      log.ok(`MariaDB (${profile}) stopped`);
      break;
    }
    case 'status': {
      const state = instanceState(bin, ctx.mariadb);
      log.ok(
        `MariaDB (${profile}): ${state.kind}${'pid' in state && state.pid ? ` (pid ${state.pid})` : ''}, data in ${ctx.config.mariadb.dataDir}`,
      );
      break;
    }
    default:
      fail('usage: npm run db:start | db:stop | db:status [-- --profile test]');
  }
}

runMain(main);
