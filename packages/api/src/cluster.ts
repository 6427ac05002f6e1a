/**
 * The server as several processes on one machine (`npm start`): this primary forks
 * `API_WORKERS` workers (default: one per core), each running server.ts on the same port
 * through Node's cluster module. Nothing a worker keeps in memory matters to correctness
 * (sessions, rate limits and the mail outbox live in MariaDB), so any worker may answer any
 * request. A worker that dies is replaced after a pause that grows while workers keep dying
 * soon after they start; if they die at start too often in a row the primary stops, since
 * restarting them again would not help. SIGINT/SIGTERM stop every worker, then the primary.
 */
import cluster from 'node:cluster';
import type { Worker } from 'node:cluster';
import { randomBytes } from 'node:crypto';
import { availableParallelism } from 'node:os';

/** Server processes to run: `API_WORKERS`, a whole number from 1, else one per core. */
function workerCount(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.API_WORKERS?.trim();
  if (!raw) return availableParallelism();
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`API_WORKERS must be a whole number of processes from 1 (it is "${raw}").`);
  return n;
}

const restartPolicy = {
  /** A worker that dies before it listens, or sooner than this after, died "at start". */
  earlyDeathMs: 5_000,
  /** After this many deaths at start in a row, the primary gives up. */
  maxEarlyDeaths: 5,
  /** The pause before replacing a worker: this, doubled for each death at start in a row… */
  firstPauseMs: 250,
  /** …up to this. */
  maxPauseMs: 10_000,
  /** How long a stop waits for workers to finish before killing them. */
  stopGraceMs: 10_000,
};

function runPrimary(count: number): void {
  /** The running workers, with when each began to listen (null: not yet). */
  const listenedAt = new Map<Worker, number | null>();
  let earlyDeaths = 0;
  /** Set once stopping: the primary's exit code once the last worker is gone. */
  let stopCode: number | null = null;

  const fork = () => listenedAt.set(cluster.fork(), null);
  cluster.on('listening', (worker) => listenedAt.set(worker, Date.now()));

  function stop(code: number): void {
    if (stopCode !== null) return;
    stopCode = code;
    if (listenedAt.size === 0) process.exit(code);
    for (const worker of listenedAt.keys()) worker.process.kill('SIGTERM');
    setTimeout(() => {
      for (const worker of listenedAt.keys()) worker.process.kill('SIGKILL');
      process.exit(code);
    }, restartPolicy.stopGraceMs).unref();
  }

  cluster.on('exit', (worker, code, signal) => {
    const listened = listenedAt.get(worker) ?? null;
    listenedAt.delete(worker);
    if (stopCode !== null) {
      if (listenedAt.size === 0) process.exit(stopCode);
      return;
    }
    const how = signal ? `signal ${signal}` : `exit code ${code}`;
    earlyDeaths = listened === null || Date.now() - listened < restartPolicy.earlyDeathMs ? earlyDeaths + 1 : 0;
    if (earlyDeaths >= restartPolicy.maxEarlyDeaths) {
      console.error(`Server workers keep stopping as they start (${earlyDeaths} times in a row, the last with ${how}); giving up. The messages above say why.`);
      stop(1);
      return;
    }
    const pause = Math.min(restartPolicy.maxPauseMs, restartPolicy.firstPauseMs * 2 ** earlyDeaths);
    console.error(`Server worker ${worker.process.pid} stopped (${how}); starting another in ${pause} ms.`);
    setTimeout(() => {
      if (stopCode === null) fork();
    }, pause);
  });

  process.on('SIGINT', () => stop(0));
  process.on('SIGTERM', () => stop(0));

  console.log(`api: ${count} server process${count === 1 ? '' : 'es'} (API_WORKERS)`);
  for (let i = 0; i < count; i++) fork();
}

if (cluster.isPrimary) {
  let count: number;
  try {
    count = workerCount();
  } catch (error) {
    console.error((error as Error).message);
    process.exit(1);
  }
  // Workers must sign cookies alike, or one would refuse the sessions another made.
  if (!process.env.SESSION_SECRET) {
    process.env.SESSION_SECRET = randomBytes(32).toString('hex');
    console.warn('SESSION_SECRET is not set: the server processes share a random one, so sessions end when the server restarts.');
  }
  runPrimary(count);
} else {
  await import('./server.js');
}
