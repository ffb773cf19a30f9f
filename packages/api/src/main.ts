/** Starts one Cairn API process (stateless: sessions, jobs and outbox live in MariaDB). */
import 'reflect-metadata';
import { createApp } from './app.factory.js';
import { ENV_CHECKED, loadConfig, unknownEnvWarnings } from './config/load-config.js';

async function main(): Promise<void> {
  const config = loadConfig();
  if (process.env[ENV_CHECKED] !== '1') {
    for (const msg of unknownEnvWarnings(config))
      console.warn(JSON.stringify({ level: 40, msg, pid: process.pid }));
  }
  const app = await createApp({ config });
  await app.listen(config.server.port, config.server.host);
  console.log(
    JSON.stringify({
      level: 30,
      msg: `Cairn API listening on http://${config.server.host}:${config.server.port}`,
      pid: process.pid,
    }),
  );
}

main().catch((error: unknown) => {
  if ((error as Error)?.name === 'ConfigError') {
    console.error((error as Error).message);
  } else {
    console.error(error);
  }
  process.exit(1);
});
