#!/usr/bin/env node
// chargewalk estimate|sweep: reads the request JSON on stdin, prints the response JSON.
// The logic is core/cli/run.ts (pure); this file only does the I/O.
import { register } from 'tsx/esm/api';

register();

const { runCli } = await import(new URL('../core/cli/run.ts', import.meta.url).href);

async function readStdin() {
  if (process.stdin.isTTY) return '';
  const chunks = [];
  for await (const chunk of process.stdin) chunks.push(chunk);
  return Buffer.concat(chunks).toString('utf8');
}

const result = runCli(process.argv.slice(2), await readStdin());
if (result.stdout) process.stdout.write(result.stdout);
if (result.stderr) process.stderr.write(result.stderr);
process.exitCode = result.code;
