/**
 * A running server writes `<database>.pid`; restore and demo:reset refuse to touch
 * a database whose server is alive. A pid file left by a killed server is stale
 * (its process is gone) and is ignored.
 */
import { readFileSync, rmSync, writeFileSync } from 'node:fs';

export function pidFilePath(dbPath: string): string {
  return `${dbPath}.pid`;
}

export function writePidFile(dbPath: string): void {
  writeFileSync(pidFilePath(dbPath), `${process.pid}\n`);
}

export function removePidFile(dbPath: string): void {
  try {
    if (readFileSync(pidFilePath(dbPath), 'utf8').trim() === String(process.pid)) rmSync(pidFilePath(dbPath), { force: true });
  } catch {
    // already gone
  }
}

/** The pid of a live server using this database, or null. */
export function runningServerPid(dbPath: string): number | null {
  let pid: number;
  try {
    pid = Number(readFileSync(pidFilePath(dbPath), 'utf8').trim());
  } catch {
    return null;
  }
  if (!Number.isInteger(pid) || pid <= 0 || pid === process.pid) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM' ? pid : null;
  }
}
