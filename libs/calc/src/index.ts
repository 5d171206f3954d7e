/** Public API of the calculation core. Import it only as `@gapwise/calc`. */
export * from './core/constants';
export * from './core/method';
