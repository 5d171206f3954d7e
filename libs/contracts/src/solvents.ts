/**
 * THE built-in solvent table (screens, the pair editor's measurement-solvent picker and the
 * solvent choice of a pair all read this one list): static dielectric constant ε_s, refractive
 * index n (sodium D line) and viscosity, at 25 °C (n at 20 °C, as the Handbook lists it).
 *
 * Source: CRC Handbook of Chemistry and Physics (sections "Permittivity (dielectric constant) of
 * liquids", "Refractive index of organic liquids" and "Viscosity of liquids"). Every value below
 * was written FROM MEMORY and not re-checked against the printed Handbook: treat the last digit
 * as uncertain and type your own ε_s and n in the CSV when they matter. Each value carries its
 * own `sources` entry with `verified: false`; the one-line `source` says both that it is
 * unverified and what to do about it (check the last digit against your edition).
 *
 * The table lives in the shared contracts so the pair editor's measurement-solvent picker offers
 * the same values as screens. The acetonitrile values
 * (ε_s = 35.94, n = 1.344) match SCIENCE.md §5 (also from memory there).
 */
export interface ValueSources {
  /** Published source of ε_s and whether it was checked against it. */
  readonly epsilon: SourceNote;
  readonly refractiveIndex: SourceNote;
  readonly viscosity: SourceNote;
}

/** A published source for one value, and whether the value was checked against it. */
export interface SourceNote {
  readonly citation: string;
  /** False: written from memory of the source, not re-checked; say so wherever it is shown. */
  readonly verified: boolean;
}

export interface Solvent {
  /** Lower-case key as typed in the CSV `solvent` column. */
  readonly key: string;
  readonly name: string;
  readonly epsilon: number;
  readonly refractiveIndex: number;
  /** Pa s (1 cP = 1e-3 Pa s). */
  readonly viscosityPaS: number;
  /** The source of each value, verified or plainly marked unverified. */
  readonly sources: ValueSources;
  /** One-line summary of the sources (shown where a single line fits). */
  readonly source: string;
}

const CRC =
  'CRC Handbook of Chemistry and Physics (from memory, unverified: check the last digit against your edition)';
const EPS: SourceNote = {
  citation:
    'CRC Handbook of Chemistry and Physics, "Permittivity (dielectric constant) of liquids", 25 °C',
  verified: false,
};
const REF: SourceNote = {
  citation:
    'CRC Handbook of Chemistry and Physics, "Physical constants of organic compounds", n_D at 20 °C',
  verified: false,
};
const VISC: SourceNote = {
  citation: 'CRC Handbook of Chemistry and Physics, "Viscosity of liquids", 25 °C',
  verified: false,
};

export const SOLVENTS: readonly Solvent[] = [
  {
    key: 'acetonitrile',
    name: 'Acetonitrile',
    epsilon: 35.94,
    refractiveIndex: 1.3442,
    viscosityPaS: 0.369e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'water',
    name: 'Water',
    epsilon: 78.36,
    refractiveIndex: 1.333,
    viscosityPaS: 0.89e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'dichloromethane',
    name: 'Dichloromethane',
    epsilon: 8.93,
    refractiveIndex: 1.4242,
    viscosityPaS: 0.413e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'dmf',
    name: 'N,N-Dimethylformamide',
    epsilon: 36.71,
    refractiveIndex: 1.4305,
    viscosityPaS: 0.794e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'dmso',
    name: 'Dimethyl sulfoxide',
    epsilon: 46.7,
    refractiveIndex: 1.4793,
    viscosityPaS: 1.987e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'methanol',
    name: 'Methanol',
    epsilon: 32.66,
    refractiveIndex: 1.3284,
    viscosityPaS: 0.544e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'ethanol',
    name: 'Ethanol',
    epsilon: 24.55,
    refractiveIndex: 1.3611,
    viscosityPaS: 1.074e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'thf',
    name: 'Tetrahydrofuran',
    epsilon: 7.52,
    refractiveIndex: 1.4072,
    viscosityPaS: 0.456e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'benzonitrile',
    name: 'Benzonitrile',
    epsilon: 25.9,
    refractiveIndex: 1.5289,
    viscosityPaS: 1.24e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'propylene-carbonate',
    name: 'Propylene carbonate',
    epsilon: 64.9,
    refractiveIndex: 1.4189,
    viscosityPaS: 2.5e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'toluene',
    name: 'Toluene',
    epsilon: 2.38,
    refractiveIndex: 1.4961,
    viscosityPaS: 0.56e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'acetone',
    name: 'Acetone',
    epsilon: 20.7,
    refractiveIndex: 1.3588,
    viscosityPaS: 0.306e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: '1,2-dichloroethane',
    name: '1,2-Dichloroethane',
    epsilon: 10.36,
    refractiveIndex: 1.4448,
    viscosityPaS: 0.779e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'chloroform',
    name: 'Chloroform',
    epsilon: 4.81,
    refractiveIndex: 1.4459,
    viscosityPaS: 0.537e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'chlorobenzene',
    name: 'Chlorobenzene',
    epsilon: 5.62,
    refractiveIndex: 1.5241,
    viscosityPaS: 0.753e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'benzene',
    name: 'Benzene',
    epsilon: 2.27,
    refractiveIndex: 1.5011,
    viscosityPaS: 0.604e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'cyclohexane',
    name: 'Cyclohexane',
    epsilon: 2.02,
    refractiveIndex: 1.4262,
    viscosityPaS: 0.894e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
  {
    key: 'n-hexane',
    name: 'n-Hexane',
    epsilon: 1.88,
    refractiveIndex: 1.3749,
    viscosityPaS: 0.3e-3,
    sources: { epsilon: EPS, refractiveIndex: REF, viscosity: VISC },
    source: CRC,
  },
];

/** "unverified" or "verified" with the citation, for a tooltip or a table footnote. */
export function sourceText(note: SourceNote): string {
  return `${note.citation}${note.verified ? ' (verified)' : ' (from memory, unverified)'}`;
}

/** Pekar factor 1/n² − 1/ε_s of a solvent: the polarity the outer-sphere λ scales with. */
export function pekarFactor(solvent: Pick<Solvent, 'epsilon' | 'refractiveIndex'>): number {
  return 1 / solvent.refractiveIndex ** 2 - 1 / solvent.epsilon;
}

const BY_KEY = new Map(SOLVENTS.map((s) => [s.key, s]));

/** The solvent for a CSV cell (case- and space-insensitive), or undefined. */
export function findSolvent(name: string): Solvent | undefined {
  return BY_KEY.get(name.trim().toLowerCase().replace(/\s+/g, '-'));
}
