/** Plot geometry shared by the web page and the PDF report. Import it only as `@gapwise/plots`. */
export * from './scale';
export * from './parabolas';
export * from './rate-curves';
export * from './label-placement';
export * from './histogram';
export * from './cascade-plots';
export * from './electrode-curves';
