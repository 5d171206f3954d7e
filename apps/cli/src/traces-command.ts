/**
 * `gapwise traces analyze --reactant R.csv --product P.csv --unit kcal/mol [--column 2]
 * [--temperature 300] [--skip-bad-lines] [--delimiter auto|comma|tab|whitespace] [--pretty]`
 *
 * Reads both files with the shared trace parser and runs the shared analysis (libs/traces, the
 * same modules as the API's `trace-analysis` job), then prints the result JSON the API stores for an analysis — the
 * same object for the same files, except `sources.*.traceId` (null here).
 *
 * Exit codes: 0 analysed; 2 refused (bad file, estimator refusal; `{ ok: false, errors }` on
 * standard output); 1 malformed command line.
 */
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { TRACE_FILE_UNITS, type TraceFileUnit } from '@gapwise/contracts';
import {
  analyzeTraces,
  readColumnSetting,
  TRACE_DELIMITERS,
  TraceAnalysisRefusal,
  TraceSettingsError,
  type TraceAnalysisInput,
  type TraceDelimiter,
} from '@gapwise/traces';
import type { Subcommand } from './subcommand';

const EXIT_OK = 0;
const EXIT_USAGE = 1;
const EXIT_REFUSED = 2;

const HELP = `Usage: gapwise traces analyze --reactant FILE --product FILE --unit UNIT [options]

Energy-gap samples ΔE = E_P − E_R from simulations in the reactant and the product state:
λ and ΔG° from means and variances, block-averaged error bars, histograms and diabatic
free-energy curves (the JSON the API stores for a trace analysis).

Options:
  --reactant FILE      samples drawn in the reactant state (text/CSV, gzip accepted)
  --product FILE       samples drawn in the product state
  --unit UNIT          unit of the values: ${TRACE_FILE_UNITS.join(', ')}
  --column COL         ΔE column: header name or 1-based number (default: the last column)
  --temperature K      temperature of the sampling in kelvin (default 300)
  --skip-bad-lines     skip bad lines (counted in the result) instead of refusing the file
  --delimiter D        auto (default), comma, tab or whitespace
  --pretty             indent the JSON
`;

interface Options {
  reactant?: string;
  product?: string;
  unit?: string;
  column?: string;
  temperature: number;
  skipBadLines: boolean;
  delimiter: string;
  pretty: boolean;
}

function parseArgs(args: readonly string[]): Options | string {
  const o: Options = { temperature: 300, skipBadLines: false, delimiter: 'auto', pretty: false };
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const [flag, inline] = a.includes('=')
      ? [a.slice(0, a.indexOf('=')), a.slice(a.indexOf('=') + 1)]
      : [a, undefined];
    const value = () => {
      const v = inline ?? args[++i];
      if (v === undefined) throw new Error(`${flag} needs a value`);
      return v;
    };
    try {
      switch (flag) {
        case '--reactant':
          o.reactant = value();
          break;
        case '--product':
          o.product = value();
          break;
        case '--unit':
          o.unit = value();
          break;
        case '--column':
          o.column = value();
          break;
        case '--temperature': {
          const v = value();
          o.temperature = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(v) ? Number(v) : NaN;
          if (!(o.temperature > 0) || !Number.isFinite(o.temperature))
            return 'Temperature must be > 0 K (absolute). Did you enter °C?';
          break;
        }
        case '--delimiter':
          o.delimiter = value();
          break;
        case '--skip-bad-lines':
          o.skipBadLines = true;
          break;
        case '--pretty':
          o.pretty = true;
          break;
        default:
          return `unknown option '${a}'`;
      }
    } catch (error) {
      return (error as Error).message;
    }
  }
  if (!o.reactant || !o.product) return '--reactant and --product are required';
  if (!o.unit) return `--unit is required (one of ${TRACE_FILE_UNITS.join(', ')})`;
  if (!(TRACE_FILE_UNITS as readonly string[]).includes(o.unit)) {
    return `Unrecognised unit '${o.unit}' for an energy; use one of ${TRACE_FILE_UNITS.join(', ')}.`;
  }
  if (!(TRACE_DELIMITERS as readonly string[]).includes(o.delimiter))
    return `--delimiter must be one of ${TRACE_DELIMITERS.join(', ')}`;
  return o;
}

async function sha256Of(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 }))
    hash.update(chunk as Buffer);
  return hash.digest('hex');
}

async function inputFor(path: string, o: Options): Promise<TraceAnalysisInput> {
  const [info, sha256] = await Promise.all([stat(path), sha256Of(path)]);
  const column = readColumnSetting(o.column);
  return {
    open: async () => createReadStream(path, { highWaterMark: 1 << 20 }),
    settings: {
      unit: o.unit as TraceFileUnit,
      column,
      skipBadLines: o.skipBadLines,
      delimiter: o.delimiter as TraceDelimiter,
    },
    sizeBytes: info.size,
    info: {
      traceId: null,
      fileName: basename(path),
      sha256,
      sizeBytes: info.size,
      unit: o.unit as string,
      columnIndex: typeof column === 'number' ? column : 0,
      columnName: typeof column === 'string' ? column : null,
      sampleCount: 0,
      skippedLineCount: 0,
    },
  };
}

export async function runTracesAnalyze(
  args: readonly string[],
  out: NodeJS.WritableStream = process.stdout,
  err: NodeJS.WritableStream = process.stderr,
): Promise<number> {
  if (args.includes('--help') || args.includes('-h')) {
    out.write(HELP);
    return EXIT_OK;
  }
  const parsed = parseArgs(args);
  if (typeof parsed === 'string') {
    err.write(`gapwise traces analyze: ${parsed}\n\n${HELP}`);
    return EXIT_USAGE;
  }
  const print = (value: unknown) =>
    out.write(JSON.stringify(value, null, parsed.pretty ? 2 : undefined) + '\n');
  let reactant: TraceAnalysisInput;
  let product: TraceAnalysisInput;
  try {
    [reactant, product] = await Promise.all([
      inputFor(parsed.reactant!, parsed),
      inputFor(parsed.product!, parsed),
    ]);
  } catch (error) {
    print({ ok: false, errors: [{ field: 'file', message: (error as Error).message }] });
    return EXIT_REFUSED;
  }
  try {
    const result = await analyzeTraces(reactant, product, parsed.temperature);
    print(result);
    return EXIT_OK;
  } catch (error) {
    if (error instanceof TraceAnalysisRefusal) {
      print({ ok: false, errors: error.errors });
      return EXIT_REFUSED;
    }
    if (error instanceof TraceSettingsError) {
      print({ ok: false, errors: [{ field: error.field, message: error.message }] });
      return EXIT_REFUSED;
    }
    throw error;
  }
}

export const tracesCommand: Subcommand = {
  summary:
    'Energy-gap traces: `gapwise traces analyze --reactant R --product P --unit U` (λ, ΔG°, curves)',
  async run(args) {
    const [action, ...rest] = args;
    if (action === 'analyze') return runTracesAnalyze(rest);
    if (action === undefined || action === '--help' || action === '-h') {
      process.stdout.write(HELP);
      return action === undefined ? EXIT_USAGE : EXIT_OK;
    }
    process.stderr.write(`gapwise traces: unknown action '${action}'.\n\n${HELP}`);
    return EXIT_USAGE;
  },
};
