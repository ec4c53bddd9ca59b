/** `npm start`: Samplewright with demo data on a private MariaDB (or DATABASE_URL). */
import { boot } from './boot';
import { ConfigError } from './config';

// a stray rejected promise (e.g. a database hiccup in a library) is logged, never fatal
process.on('unhandledRejection', (reason) => {
  console.error('unhandled rejection:', reason);
});

async function main() {
  const running = await boot();
  console.log(`\nSamplewright is up: ${running.url}\n(Ctrl-C stops the server and its database)`);
  let signalled = false;
  const shutdown = (sig: string) => {
    if (signalled) return;
    signalled = true;
    console.log(`\n${sig}: stopping…`);
    running.stop().then(
      () => process.exit(0),
      (e) => {
        console.error(e);
        process.exit(1);
      },
    );
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((e) => {
  console.error(e instanceof ConfigError || e instanceof Error ? e.message : e);
  process.exit(1);
});
