/**
 * Physical constants, CODATA 2018 recommended values
 * (E. Tiesinga et al., Rev. Mod. Phys. 2021, 93, 025010; doi 10.1103/RevModPhys.93.025010).
 * e, h, k_B, N_A and c are exact in the 2019 SI. Every constant of the calculation core lives here once.
 */

/** Boltzmann constant k_B in eV per kelvin (exact: 1.380649e-23 J/K ÷ e). */
export const BOLTZMANN_EV_PER_K = 8.617333262e-5;
/** Reduced Planck constant ħ in eV s. */
export const HBAR_EV_S = 6.582119569e-16;
/** Planck constant h in eV s (exact). */
export const PLANCK_EV_S = 4.135667696e-15;
/** Elementary charge in coulomb (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Avogadro constant per mole (exact). */
export const AVOGADRO_PER_MOL = 6.02214076e23;
/** Molar gas constant R in J mol⁻¹ K⁻¹ (exact product N_A k_B). */
export const GAS_CONSTANT_J_PER_MOL_K = 8.314462618;
/** Faraday constant in C mol⁻¹ (exact product N_A e). */
export const FARADAY_C_PER_MOL = 96485.33212;
/** Speed of light in vacuum in cm s⁻¹ (exact). */
export const SPEED_OF_LIGHT_CM_PER_S = 2.99792458e10;
/** Coulomb energy constant e²/(4πε₀) in eV Å (CODATA 2018 ε₀ = 8.8541878128e-12 F/m). */
export const COULOMB_EV_ANGSTROM = 14.3996454784;
/** Wavenumbers per eV: 1 eV = 8065.543937 cm⁻¹. */
export const CM1_PER_EV = 8065.543937;
/** kJ/mol per eV: 1 eV = 96.48533212 kJ/mol. */
export const KJ_PER_MOL_PER_EV = 96.48533212;
/** kcal/mol per eV (thermochemical calorie, 4.184 J): 1 eV = 23.06054783 kcal/mol. */
export const KCAL_PER_MOL_PER_EV = 23.06054783;
/** eV per hartree: 1 E_h = 27.211386245988 eV. */
export const EV_PER_HARTREE = 27.211386245988;
/** e·Å per debye: 1 D = 1e-21/c C m = 0.20819433271 e·Å (exact definition, CODATA 2018 c and e). */
export const E_ANGSTROM_PER_DEBYE = 0.20819433271;
/**
 * hc in eV nm, for energies of light E = hc/λ: h (eV s, exact) × c (nm s⁻¹, exact) =
 * 1239.84198 eV nm (SCIENCE.md §16).
 */
export const HC_EV_NM = PLANCK_EV_S * 2.99792458e17;
