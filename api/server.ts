// The one place that listens. npm start runs it compiled (dist/server/server.js, built by
// scripts/build-server.mjs) after building the client; npm run dev runs it through tsx.
import { createApp } from './app';
import { superviseWorkers } from './workers/supervisor';

const DEMO_PEOPLE = [
  ['Ada Brennan', 'admin', 'ada.brennan@brackwater.example'],
  ['Ines Marlow', 'author', 'ines.marlow@brackwater.example'],
  ['Tomasz Reyes', 'checker', 'tomasz.reyes@brackwater.example'],
  ['Priya Anand', 'principal', 'priya.anand@brackwater.example'],
  ['Lena Ostrowski', 'viewer', 'lena.ostrowski@kestrelquay.example'],
] as const;

async function main(): Promise<void> {
  const { app, config, close, ctx } = await createApp();
  const server = app.listen(config.port, config.host);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  }).catch((e: NodeJS.ErrnoException) => {
    if (e.code === 'EADDRINUSE') {
      throw new Error(
        `Port ${config.port} on ${config.host} is taken; set MW_PORT to a free port.`,
      );
    }
    throw e;
  });

  // The evaluation workers: child processes of their own, restarted when one dies.
  const workers = superviseWorkers(config.workers, ctx.log);

  const url = `http://${config.host}:${config.port}/`;
  const lines = [
    '',
    `Modewright is running at ${url}${config.dev ? ' (development, hot reload)' : ''}`,
    `Evaluation workers: ${config.workers} process${config.workers === 1 ? '' : 'es'} on the queue ${config.queue.redisUrl}`,
    '',
    'Demo sign-ins (password for each: modewright-demo):',
    ...DEMO_PEOPLE.map(([name, role, email]) => `  ${email.padEnd(36)} ${name} (${role})`),
    '',
  ];
  process.stdout.write(lines.join('\n') + '\n');

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    process.stdout.write(`${signal}: stopping\n`);
    server.close();
    server.closeAllConnections();
    Promise.all([workers.close(), close()]).then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((e: unknown) => {
  process.stderr.write(
    `Modewright could not start: ${e instanceof Error ? e.message : String(e)}\n`,
  );
  process.exit(1);
});
