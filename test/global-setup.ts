// Builds the tablet client once per test run into its own folder, so parallel
// runs never race on dist/. Browser tests read the folder with inject('clientDir').
// Set CHARGEWALK_SKIP_CLIENT_BUILD=1 to skip it when running only core or server tests.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';

export default async function setup(project: TestProject) {
  const root = process.cwd();
  if (process.env.CHARGEWALK_SKIP_CLIENT_BUILD === '1' || !existsSync(join(root, 'client', 'index.html'))) {
    project.provide('clientDir', '');
    return;
  }
  const { build } = await import('vite');
  const outDir = mkdtempSync(join(tmpdir(), 'chargewalk-client-'));
  await build({ configFile: join(root, 'vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true, sourcemap: false } });
  project.provide('clientDir', outDir);
  return () => rmSync(outDir, { recursive: true, force: true });
}

declare module 'vitest' {
  export interface ProvidedContext {
    clientDir: string;
  }
}
