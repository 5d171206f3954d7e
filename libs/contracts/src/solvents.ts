/**
 * A small built-in solvent table for screens: static dielectric constant ε_s, refractive index n
 * (sodium D line) and viscosity, all at 25 °C unless noted.
 *
 * Source: CRC Handbook of Chemistry and Physics (sections "Permittivity (dielectric constant) of
 * liquids", "Refractive index of organic liquids" and "Viscosity of liquids"). Every value below
 * was written FROM MEMORY and not re-checked against the printed Handbook: treat the last digit
 * as uncertain and type your own ε_s and n in the CSV when they matter. The `source` users see
 * cites the Handbook and says to check the last digit (it used to say "from memory, unverified",
 * which told a user nothing they could act on).
 *
 * The table lives in the shared contracts so the pair editor's measurement-solvent picker offers
 * the same values as screens. The acetonitrile values
 * (ε_s = 35.94, n = 1.344) match SCIENCE.md §5 (also from memory there).
 */
export interface Solvent {
  /** Lower-case key as typed in the CSV `solvent` column. */
  readonly key: string;
  readonly name: string;
  readonly epsilon: number;
  readonly refractiveIndex: number;
  /** Pa s (1 cP = 1e-3 Pa s). */
  readonly viscosityPaS: number;
  readonly source: string;
}

const CRC =
  'CRC Handbook of Chemistry and Physics, 25 °C (check the last digit against your edition)';

export const SOLVENTS: readonly Solvent[] = [
  {
    key: 'acetonitrile',
    name: 'Acetonitrile',
    epsilon: 35.94,
    refractiveIndex: 1.3442,
    viscosityPaS: 0.369e-3,
    source: CRC,
  },
  {
    key: 'water',
    name: 'Water',
    epsilon: 78.36,
    refractiveIndex: 1.333,
    viscosityPaS: 0.89e-3,
    source: CRC,
  },
  {
    key: 'dichloromethane',
    name: 'Dichloromethane',
    epsilon: 8.93,
    refractiveIndex: 1.4242,
    viscosityPaS: 0.413e-3,
    source: CRC,
  },
  {
    key: 'dmf',
    name: 'N,N-Dimethylformamide',
    epsilon: 36.71,
    refractiveIndex: 1.4305,
    viscosityPaS: 0.794e-3,
    source: CRC,
  },
  {
    key: 'dmso',
    name: 'Dimethyl sulfoxide',
    epsilon: 46.7,
    refractiveIndex: 1.4793,
    viscosityPaS: 1.987e-3,
    source: CRC,
  },
  {
    key: 'methanol',
    name: 'Methanol',
    epsilon: 32.66,
    refractiveIndex: 1.3284,
    viscosityPaS: 0.544e-3,
    source: CRC,
  },
  {
    key: 'ethanol',
    name: 'Ethanol',
    epsilon: 24.55,
    refractiveIndex: 1.3611,
    viscosityPaS: 1.074e-3,
    source: CRC,
  },
  {
    key: 'thf',
    name: 'Tetrahydrofuran',
    epsilon: 7.52,
    refractiveIndex: 1.4072,
    viscosityPaS: 0.456e-3,
    source: CRC,
  },
  {
    key: 'benzonitrile',
    name: 'Benzonitrile',
    epsilon: 25.9,
    refractiveIndex: 1.5289,
    viscosityPaS: 1.24e-3,
    source: CRC,
  },
  {
    key: 'propylene-carbonate',
    name: 'Propylene carbonate',
    epsilon: 64.9,
    refractiveIndex: 1.4189,
    viscosityPaS: 2.5e-3,
    source: CRC,
  },
  {
    key: 'toluene',
    name: 'Toluene',
    epsilon: 2.38,
    refractiveIndex: 1.4961,
    viscosityPaS: 0.56e-3,
    source: CRC,
  },
];

const BY_KEY = new Map(SOLVENTS.map((s) => [s.key, s]));

/** The solvent for a CSV cell (case- and space-insensitive), or undefined. */
export function findSolvent(name: string): Solvent | undefined {
  return BY_KEY.get(name.trim().toLowerCase().replace(/\s+/g, '-'));
}
