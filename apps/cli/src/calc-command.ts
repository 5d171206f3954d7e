/**
 * `gapwise calc`: one JSON request on standard input, one answer line on standard output; with
 * `--batch`, JSON lines in and JSON lines out, streamed in constant memory (CALC-API.md).
 *
 * Exit codes: 0 when every answer is ok; 2 when a request (or any batch line) was refused, named
 * an unknown method or was not valid JSON; 1 for a malformed command line.
 */
import { createInterface } from 'node:readline';
import type { Readable, Writable } from 'node:stream';
import { calculate, serializeAnswer, type CalcAnswer } from '@gapwise/calc';
import { calcHelp } from './calc-help';
import type { Subcommand } from './subcommand';

export const EXIT_OK = 0;
export const EXIT_REFUSED = 2;
const EXIT_USAGE = 1;
/** Output is written in chunks of about this many characters. */
const WRITE_CHUNK_CHARS = 1 << 16;

function invalidJson(detail: string): CalcAnswer {
  return { ok: false, errors: [{ field: 'request', message: `Invalid JSON: ${detail}` }] };
}

/** Answers one request given as JSON text. Never throws. */
export function answerText(text: string): CalcAnswer {
  if (text.trim() === '') return invalidJson('empty input; expected one JSON request.');
  let request: unknown;
  try {
    request = JSON.parse(text);
  } catch (error) {
    return invalidJson(error instanceof Error ? error.message : String(error));
  }
  return calculate(request);
}

async function readAll(input: Readable): Promise<string> {
  input.setEncoding('utf8');
  let text = '';
  for await (const chunk of input) text += chunk as string;
  return text;
}

/** Writes text, waiting for the stream to drain when its buffer is full. */
function write(output: Writable, text: string): Promise<void> {
  if (output.write(text)) return Promise.resolve();
  return new Promise((resolve) => output.once('drain', () => resolve()));
}

/** Single mode: the whole input is one request. */
export async function runSingle(input: Readable, output: Writable): Promise<number> {
  const answer = answerText(await readAll(input));
  await write(output, `${serializeAnswer(answer)}\n`);
  return answer.ok ? EXIT_OK : EXIT_REFUSED;
}

/**
 * Batch mode: one answer line per input line, in order, streamed. Blank lines are answered with
 * their own refusal so answers stay aligned with lines.
 */
export async function runBatch(input: Readable, output: Writable): Promise<number> {
  const lines = createInterface({ input, crlfDelay: Number.POSITIVE_INFINITY });
  let pending = '';
  let anyRefused = false;
  for await (const line of lines) {
    const answer = answerText(line);
    if (!answer.ok) anyRefused = true;
    pending += `${serializeAnswer(answer)}\n`;
    if (pending.length >= WRITE_CHUNK_CHARS) {
      await write(output, pending);
      pending = '';
    }
  }
  if (pending !== '') await write(output, pending);
  return anyRefused ? EXIT_REFUSED : EXIT_OK;
}

export const calcCommand: Subcommand = {
  summary: 'Run calculation requests (JSON on stdin; --batch for JSON lines).',
  async run(args) {
    const known = new Set(['--batch', '--help', '-h']);
    const unknown = args.filter((arg) => !known.has(arg));
    if (args.includes('--help') || args.includes('-h')) {
      process.stdout.write(calcHelp());
      return EXIT_OK;
    }
    if (unknown.length > 0) {
      process.stderr.write(
        `gapwise calc: unknown option '${unknown[0]}'. See gapwise calc --help.\n`,
      );
      return EXIT_USAGE;
    }
    return args.includes('--batch')
      ? runBatch(process.stdin, process.stdout)
      : runSingle(process.stdin, process.stdout);
  },
};
