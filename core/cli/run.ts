/**
 * The `chargewalk` command's logic, pure: argv and the whole of stdin in, exit code and
 * the two output texts out. bin/chargewalk.mjs does the I/O.
 *
 *   chargewalk estimate   < request.json   -> EstimateResponse JSON on stdout
 *   chargewalk sweep      < request.json   -> SweepResponse JSON on stdout
 *
 * Bad input prints the API's error envelope { error: { code: 'invalid', message,
 * fields: [{ path, message }] } } on stderr and exits 2; usage errors exit 2 too.
 */
import { z } from 'zod';
import { estimate } from '../physics/estimate';
import { sweep } from '../physics/sweep';
import { issuesToFields } from '../schemas/common';
import { EstimateRequestSchema, SweepRequestSchema } from '../schemas/estimate';

export interface CliResult {
  code: number;
  stdout: string;
  stderr: string;
}

export const USAGE = `Usage: chargewalk <estimate|sweep>
  Reads the request JSON on standard input and prints the response JSON.
  estimate  one reading with one model (POST /api/estimate body)
  sweep     readings at three or more distances (POST /api/sweep body)
Exit codes: 0 ok, 2 bad input or usage.
`;

function invalid(message: string, fields: { path: string; message: string }[] = []): CliResult {
  return { code: 2, stdout: '', stderr: `${JSON.stringify({ error: { code: 'invalid', message, fields } }, null, 2)}\n` };
}

/**
 * Runs the command.
 * @param argv the arguments after the program name, e.g. ['estimate']
 * @param stdin the whole standard input
 * @returns exit code and the texts for stdout and stderr
 * @example runCli(['estimate'], '{"model":"point","fieldVPerM":1e5,"distanceM":0.03}').code // 0
 */
export function runCli(argv: readonly string[], stdin: string): CliResult {
  const cmd = argv[0];
  if (cmd === '--help' || cmd === '-h' || cmd === 'help') return { code: 0, stdout: USAGE, stderr: '' };
  if (cmd !== 'estimate' && cmd !== 'sweep') {
    return { code: 2, stdout: '', stderr: `${cmd === undefined ? 'chargewalk: no command given' : `chargewalk: unknown command '${cmd}'`}\n${USAGE}` };
  }
  if (argv.length > 1) return { code: 2, stdout: '', stderr: `chargewalk: unexpected argument '${argv[1]}'\n${USAGE}` };
  let body: unknown;
  try {
    body = JSON.parse(stdin);
  } catch {
    return invalid('the request on standard input is not valid JSON', [{ path: '(body)', message: 'not valid JSON' }]);
  }
  const schema = cmd === 'estimate' ? EstimateRequestSchema : SweepRequestSchema;
  const parsed = schema.safeParse(body);
  if (!parsed.success) {
    const fields = issuesToFields(parsed.error);
    return invalid(fields.map((f) => f.message).join('; '), fields);
  }
  try {
    const out = cmd === 'estimate' ? estimate(parsed.data as z.input<typeof EstimateRequestSchema>) : sweep(parsed.data as z.input<typeof SweepRequestSchema>);
    return { code: 0, stdout: `${JSON.stringify(out, null, 2)}\n`, stderr: '' };
  } catch (e) {
    if (e instanceof RangeError) return invalid(e.message);
    if (e instanceof z.ZodError) {
      const fields = issuesToFields(e);
      return invalid(fields.map((f) => f.message).join('; '), fields);
    }
    return { code: 1, stdout: '', stderr: `${JSON.stringify({ error: { code: 'internal', message: e instanceof Error ? e.message : String(e) } }, null, 2)}\n` };
  }
}
