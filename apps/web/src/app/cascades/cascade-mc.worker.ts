/**
 * Monte Carlo of a cascade off the main thread: receives the `uncertainty.monteCarlo` request,
 * answers the intervals (the page stays responsive while 2,000 networks are solved).
 */
import { runMonteCarlo } from './cascade-compute';

addEventListener('message', ({ data }: MessageEvent<{ id: number; request: unknown }>) => {
  postMessage({ id: data.id, result: runMonteCarlo(data.request) });
});
