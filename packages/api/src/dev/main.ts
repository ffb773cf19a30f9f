/** Entry point of the local fakes process (started by `npm start` and the browser tests). */
import { loadConfig } from '../config/load-config.js';
import { startDevFakes } from './fakes.js';

async function main(): Promise<void> {
  const config = loadConfig();
  const fakes = await startDevFakes(config);
  console.log(
    JSON.stringify({
      level: 30,
      msg: `Cairn local fakes on http://${config.devFakes.host}:${config.devFakes.port} (SMTP capture on ${config.devFakes.smtpPort})`,
    }),
  );
  const stop = () => void fakes.close().then(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((error: unknown) => {
  console.error((error as Error).message ?? error);
  process.exit(1);
});
