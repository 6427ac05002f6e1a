// One running instance per purpose: a second `npm start` stops with a clear message.
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fail } from './log.mjs';

function isAlive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return error.code === 'EPERM';
  }
}

/** Takes the lock file or fails naming the PID that holds it; returns a release function. */
export function takeLock(file, what) {
  mkdirSync(path.dirname(file), { recursive: true });
  if (existsSync(file)) {
    const pid = Number(readFileSync(file, 'utf8').trim());
    if (pid && pid !== process.pid && isAlive(pid)) {
      fail(`${what} is already running (process ${pid}). Stop it first (Ctrl-C in its terminal, or kill ${pid}).`);
    }
  }
  writeFileSync(file, String(process.pid));
  return () => rmSync(file, { force: true });
}
