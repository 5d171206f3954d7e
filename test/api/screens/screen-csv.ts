/** Deterministic screen CSVs of invented mediator pairs for tests and benchmarks. */
export const SCREEN_HEADER =
  'donor,acceptor,donorOxidation [V],acceptorReduction [V],excitationEnergy [eV],distance [A],' +
  'radiusDonor [A],radiusAcceptor [A],solvent,lambdaInner [eV],coupling [cm-1],hbarOmega [eV],temperature [K]';

/** `rows` data rows from a seeded linear congruential generator (same seed, same file). */
export function screenCsv(rows: number, seed = 1): string {
  let state = seed >>> 0;
  const rand = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const lines = [SCREEN_HEADER];
  for (let i = 0; i < rows; i++) {
    const eox = (0.4 + rand()).toFixed(3);
    const ered = (-1.6 + rand()).toFixed(3);
    const r = (7.2 + 4 * rand()).toFixed(2);
    const h = (10 + 150 * rand()).toFixed(1);
    const mode = i % 3 === 0 ? '0.18' : '';
    lines.push(
      `Med-${i + 1},Med-${i + 2},${eox},${ered},2.45,${r},3.5,3.6,acetonitrile,0.15,${h},${mode},298.15`,
    );
  }
  return `${lines.join('\n')}\n`;
}
