// Child processes: run to completion, or start a long-lived service we can stop cleanly.
import { spawn, spawnSync } from 'node:child_process';
import { fail } from './log.mjs';

/** Runs a command with inherited output; resolves with its exit code. */
export function run(command, args, options = {}) {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: 'inherit', ...options });
    child.on('error', reject);
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

/** Runs a command and fails with `what` in the message when it exits non-zero. */
export async function mustRun(what, command, args, options = {}) {
  const code = await run(command, args, options);
  if (code !== 0) fail(`${what} failed (exit ${code}).`);
}

/** True when `command` is found on PATH. */
export function hasCommand(command) {
  return spawnSync('sh', ['-c', `command -v ${command}`], { stdio: 'ignore' }).status === 0;
}

/**
 * Starts a long-lived process in its own process group, so stopping it also stops
 * anything it started. Output goes to the given stream (default: inherited).
 */
export function startService(name, command, args, options = {}) {
  const child = spawn(command, args, { stdio: 'inherit', detached: true, ...options });
  const service = {
    name,
    child,
    exited: new Promise((resolve) => child.on('exit', (code, signal) => resolve({ code, signal }))),
    async stop(timeoutMs = 10_000) {
      if (child.exitCode !== null || child.signalCode !== null) return;
      try {
        process.kill(-child.pid, 'SIGTERM');
      } catch {
        return;
      }
      const timer = setTimeout(() => {
        try {
          process.kill(-child.pid, 'SIGKILL');
        } catch {
          // already gone
        }
      }, timeoutMs);
      await service.exited;
      clearTimeout(timer);
    },
  };
  return service;
}

/**
 * Ctrl-C or SIGTERM: stops what a script started, the services newest first, then `stopLast`
 * (the database under them), and exits 130. `services` is read when the signal comes, so the
 * script pushes to it as it starts each one.
 */
export function stopAllOnSignal(services, stopLast) {
  let interrupted = false;
  const stop = () => {
    if (interrupted) return;
    interrupted = true;
    void (async () => {
      for (const service of [...services].reverse()) await service.stop();
      await stopLast();
      process.exit(130);
    })();
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
