/** Types and small rules shared by the web app, the API and the command line. */
export * from './auth';
export * from './errors';
export * from './pairs';
export * from './roles';
export * from './workspaces';
export * from './pair-model';
export * from './reports';
export * from './report-format';
export {
  provenanceParts,
  provenanceHref,
  helperName,
  type ProvenanceLink,
  type ProvenancePart,
} from './provenance-text';
export * from './traces';
export * from './screens';
export * from './rich-text';
export * from './csv';
export * from './plausibility';
export * from './solvents';
export * from './materials';
export * from './potential-reference';
