// Worker entry when the server runs from its TypeScript sources (vitest, tsx): registers tsx's
// loader in this worker thread, then loads the TypeScript entry. The bundled server uses the
// esbuild bundle of compute-worker.ts instead (compute-pool.ts picks which).
import { register } from 'tsx/esm/api';

register();
const { default: runComputeJob } = await import('./compute-worker.ts');
export default runComputeJob;
