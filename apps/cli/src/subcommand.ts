/** One `gapwise` subcommand: a one-line summary and a runner returning the exit code. */
export interface Subcommand {
  readonly summary: string;
  run(args: readonly string[]): Promise<number>;
}
