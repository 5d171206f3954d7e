/**
 * `gapwise calc`: one JSON request on standard input, one answer line on standard output; with
 * `--batch`, JSON lines in and JSON lines out, streamed in constant memory (CALC-API.md).
 *
 * Exit codes: 0 when every answer is ok; 2 when a request (or any batch line) was refused, named
 * an unknown method or was not valid JSON; 1 for a malformed command line.
 */
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
 * their own refusal so answers stay aligned with lines. Line ends are those of `readline` (LF,
 * CRLF, or a lone CR); lines are split out of each chunk by hand and answered synchronously,
 * because an async iterator step per line cost more CPU than the calculation it carried.
 */
export async function runBatch(input: Readable, output: Writable): Promise<number> {
  input.setEncoding('utf8');
  let carry = '';
  let pending = '';
  let anyRefused = false;
  const answerLine = (line: string) => {
    const answer = answerText(line);
    if (!answer.ok) anyRefused = true;
    pending += `${serializeAnswer(answer)}\n`;
  };
  const answerLines = (text: string) => {
    // A lone CR (not followed by LF) also ends a line, as in readline.
    if (text.includes('\r')) for (const line of text.split(/\r\n?/)) answerLine(line);
    else answerLine(text);
  };
  for await (const chunk of input) {
    const text = carry + (chunk as string);
    let from = 0;
    for (let nl = text.indexOf('\n'); nl !== -1; nl = text.indexOf('\n', from)) {
      answerLines(text.slice(from, nl > from && text.charCodeAt(nl - 1) === 13 ? nl - 1 : nl));
      from = nl + 1;
    }
    carry = text.slice(from);
    // A CR at the very end may be the first half of a CRLF split across chunks: keep it.
    if (carry.length > 1 && carry.includes('\r')) {
      const keep = carry.endsWith('\r') ? 1 : 0;
      const done = carry.slice(0, carry.length - keep);
      const cut = done.lastIndexOf('\r');
      if (cut !== -1) {
        answerLines(done.slice(0, cut));
        carry = carry.slice(cut + 1);
      }
    }
    if (pending.length >= WRITE_CHUNK_CHARS) {
      await write(output, pending);
      pending = '';
    }
  }
  if (carry !== '') answerLines(carry.endsWith('\r') ? carry.slice(0, -1) : carry);
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
