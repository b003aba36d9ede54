import type { Server } from 'node:http';
import { loadConfig } from './config';
import { startRuntime } from './runtime';
import { createApp } from './app';
import { seedDemo } from './seeders/demo';
import { startHousekeeping } from './services/housekeeping';

/** Process entry: configuration, database, local fakes, demo data, listen, graceful shutdown. */
async function main(): Promise<void> {
  const config = loadConfig();
  const runtime = await startRuntime(config, { migrate: true });
  const seeded = await seedDemo(runtime.deps);
  const app = createApp(runtime.deps);
  const stopHousekeeping = startHousekeeping(runtime.deps);
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
  });
  const lines = [
    '',
    `  Sparkwright is up at ${config.appUrl}`,
    `  Demo shop: ${seeded.shopName}; password for every demo account: ${config.DEMO_PASSWORD}`,
    ...seeded.accounts.map((a) => `    ${a.email.padEnd(24)} ${a.roles.join(', ')}`),
    runtime.fakes.smtp ? `  Mail goes to the local receiver (port ${runtime.fakes.smtp.port}); read it under Shop > Mail.` : '',
    runtime.fakes.s3 ? `  Photos go to the local object store at ${runtime.fakes.s3.endpoint}.` : '',
    '  Press Ctrl-C to stop.',
    '',
  ];
  console.log(lines.filter((l) => l !== '').join('\n'));

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n[sparkwright] ${signal}: stopping`);
    stopHousekeeping();
    server.close(() => {
      const pool = app.locals.sessionPool as { end(): Promise<void> } | undefined;
      Promise.resolve(pool?.end())
        .then(() => runtime.close())
        .then(() => process.exit(0))
        .catch(() => process.exit(1));
    });
    server.closeAllConnections();
    setTimeout(() => process.exit(1), 8000).unref();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
