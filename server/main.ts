import { DEMO_PASSWORD, DEMO_PEOPLE } from './demo/demo-scenario';
import { loadConfig } from './lib/config';
import { startServer } from './server';

/** Grace period for open requests at shutdown before the process exits anyway. */
const SHUTDOWN_GRACE_MS = 10_000;

async function main(): Promise<void> {
  const config = loadConfig();
  const running = await startServer(config);
  process.stdout.write(`\nHeapsight is running at ${running.url}\n`);
  if (config.isDemo) {
    process.stdout.write(`Demo accounts (password "${DEMO_PASSWORD}"):\n`);
    for (const person of DEMO_PEOPLE) {
      process.stdout.write(`  ${person.role.padEnd(10)} ${person.email}\n`);
    }
  }

  let isStopping = false;
  const stop = (signal: string) => {
    if (isStopping) {
      return;
    }
    isStopping = true;
    process.stdout.write(`\n${signal}: stopping\n`);
    setTimeout(() => process.exit(1), SHUTDOWN_GRACE_MS).unref();
    running.stop().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
