/**
 * Entry of the `gapwise` command. Each subcommand is one row of the table below; new ones (e.g.
 * `traces`) are added as a row and a module beside this file.
 */
import { calcCommand } from './calc-command';
import { tracesCommand } from './traces-command';
import type { Subcommand } from './subcommand';

const SUBCOMMANDS: Readonly<Record<string, Subcommand>> = {
  calc: calcCommand,
  traces: tracesCommand,
};

/** Exit code for a malformed command line (not a refused calculation). */
export const EXIT_USAGE = 1;

function usage(): string {
  const rows = Object.entries(SUBCOMMANDS).map(
    ([name, command]) => `  ${name.padEnd(8)} ${command.summary}`,
  );
  return [
    'Usage: gapwise <command> [options]',
    '',
    'Commands:',
    ...rows,
    '',
    'Run `gapwise <command> --help` for details.',
    '',
  ].join('\n');
}

async function main(argv: readonly string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h') {
    process.stdout.write(usage());
    return name === undefined ? EXIT_USAGE : 0;
  }
  const command = Object.hasOwn(SUBCOMMANDS, name) ? SUBCOMMANDS[name] : undefined;
  if (!command) {
    process.stderr.write(`gapwise: unknown command '${name}'.\n\n${usage()}`);
    return EXIT_USAGE;
  }
  return command.run(rest);
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(`gapwise: ${error instanceof Error ? error.stack : String(error)}\n`);
    process.exitCode = 70;
  },
);
