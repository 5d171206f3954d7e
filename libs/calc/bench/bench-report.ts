/** Text of the benchmark figures, so the runner stays a list of calls. */
import type { BatchFigure } from './batch-cli.bench';
import type { ThroughputFigure } from './vector-rates.bench';

const millions = (perSecond: number) => `${(perSecond / 1e6).toFixed(1)} M/s`;

export function throughputSummary(figure: ThroughputFigure): string {
  const verdict =
    Math.max(figure.perSecond, figure.perCpuSecond) >= figure.target ? 'meets' : 'BELOW';
  return (
    `${figure.label}, 1e6 pairs: best of ${figure.runs} ${figure.bestMs.toFixed(1)} ms wall, ` +
    `${millions(figure.perSecond)} wall, ${millions(figure.perCpuSecond)} per CPU second ` +
    `(${figure.nsPerEvaluation.toFixed(1)} ns/rate); ${verdict} target ${millions(figure.target)}`
  );
}

export function batchSummary(figure: BatchFigure): string {
  const verdict = figure.linesPerSecond >= 50_000 ? 'meets' : 'BELOW';
  const rss =
    figure.peakRssMb === undefined ? 'n/a (no /usr/bin/time)' : `${figure.peakRssMb.toFixed(0)} MB`;
  return [
    `gapwise calc --batch, ${figure.lines} lines (${figure.answers} answers):`,
    `  wall ${figure.wallMs.toFixed(0)} ms including start-up ${figure.startupMs.toFixed(0)} ms`,
    `  ${Math.round(figure.linesPerSecond)} lines/s overall, ${Math.round(figure.steadyLinesPerSecond)} lines/s ` +
      `streaming; ${verdict} target 50000 lines/s overall`,
    `  ${figure.linesPerCpuSecond === undefined ? 'n/a' : Math.round(figure.linesPerCpuSecond)} lines per CPU ` +
      'second of the command (start-up subtracted; independent of machine load)',
    `  peak RSS of the command: ${rss}`,
  ].join('\n');
}

/** The numpy peer of the per-element Marcus figure, with the ratio and the agreement check. */
export function numpyComparison(
  figure: ThroughputFigure & { sum: number },
  peer: { bestMs: number; sum: number } | undefined,
): string {
  if (!peer) return '  numpy peer: python3 with numpy not found here; no ratio';
  const agree = Math.abs(peer.sum - figure.sum) / Math.abs(peer.sum);
  return (
    `  numpy peer, same inputs and formula, best of ${figure.runs}: ${peer.bestMs.toFixed(1)} ms = ` +
    `${millions(1e6 / (peer.bestMs / 1000))}; Gapwise / numpy = ${(peer.bestMs / figure.bestMs).toFixed(2)}× ` +
    `(sums of log10 k agree to ${agree.toExponential(1)} relative)`
  );
}
