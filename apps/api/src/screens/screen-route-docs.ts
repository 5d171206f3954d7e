/**
 * OpenAPI rows and schemas of the screen and series routes (spread into ROUTE_DOCS and the
 * schemas).
 */
import { SCREEN_NUMERIC_COLUMNS, SCREEN_SCORE_KINDS, SCREEN_STATUSES } from '@gapwise/contracts';
import type { RouteDoc } from '../docs/route-docs';
import { SCREEN_WARNINGS } from './chunk-computer';
import { arr, bool, int, nullable, num, obj, ref, str, type Schema } from '../docs/schema';

const member = 'any member of the workspace (non-members get 404)';
const editor = 'owner or editor (reviewer, viewer: 403; non-members: 404)';

const resultQuery = [
  {
    name: 'sort',
    description: `${[...SCREEN_NUMERIC_COLUMNS, 'donor', 'acceptor', 'custom'].join(' | ')}; prefix - for descending (default -score); custom only with a custom score`,
  },
  {
    name: 'custom',
    description:
      'a custom score sent per row as customScore: comma-separated column:weight terms (at most 6) over the numeric result columns except rowNumber and score, e.g. log10kCsMlj:1,log10kCrMlj:-1',
  },
  { name: 'offset', description: 'first row (default 0)' },
  { name: 'limit', description: 'rows per page, 1–1000 (default 50)' },
  {
    name: '<column>Min, <column>Max',
    description: `numeric range on any of ${SCREEN_NUMERIC_COLUMNS.join(', ')} (eV, K, log10 of s⁻¹)`,
  },
  { name: 'regimeCs', description: 'normal | activationless | inverted (charge separation)' },
  { name: 'regimeCr', description: 'normal | activationless | inverted (charge recombination)' },
  {
    name: 'warning',
    description: `rows carrying any of these comma-separated codes: ${SCREEN_WARNINGS.join(', ')}`,
  },
  { name: 'noWarnings', description: 'true: only rows without warnings' },
  { name: 'q', description: 'text in donor or acceptor' },
];

export const SCREEN_ROUTE_DOCS: readonly RouteDoc[] = [
  {
    method: 'get',
    path: '/screens/template.csv',
    tag: 'screens',
    summary: 'The screen template: header cells `name` or `name [unit]` and two example rows',
    access: 'anyone',
    auth: false,
    status: 200,
  },
  {
    method: 'get',
    path: '/screens/options',
    tag: 'screens',
    summary: 'Built-in solvent table (with sources), ranking scores and warning codes',
    access: 'anyone',
    auth: false,
    status: 200,
    response: 'ScreenOptions',
  },
  {
    method: 'post',
    path: '/workspaces/:wid/screens',
    tag: 'screens',
    summary:
      'Upload a screen as multipart/form-data (field `file`), a text/csv body, or JSON `{ "csv": "…" }` (a paste). Streamed into chunks queued on `screen-chunk`. Bad rows answer 400 screen-bad-rows with up to 20 line numbers (nothing saved) unless runGoodRows=true; more than SCREEN_MAX_ROWS rows or SCREEN_MAX_BYTES bytes answer 413; equal inputs reuse a finished screen',
    access: editor,
    auth: true,
    body: 'ScreenPaste',
    status: 201,
    response: 'Screen',
    errors: [413],
    query: [
      { name: 'name', description: 'name of the screen (default: the date and time)' },
      {
        name: 'runGoodRows',
        description: 'true: run the good rows of a file with bad rows (recorded as run-good)',
      },
      {
        name: 'badRowChoice',
        description: 'fixed (the file was fixed after a bad-row report) | none',
      },
      { name: 'score', description: SCREEN_SCORE_KINDS.join(' | ') },
      {
        name: 'floorEv',
        description: 'driving-force floor of fastest-forward-above-floor (eV, default 0.1)',
      },
      {
        name: 'assumedHbarOmegaEv',
        description:
          'ħω (eV, 0.0124–0.496) the score assumes for a step in the inverted region whose row gives none (default 0.186 eV = 1500 cm⁻¹); rows that used it carry assumed-hbar-omega',
      },
      { name: 'chunkSize', description: 'rows per job, 50–20000 (default 2000)' },
    ],
  },
  {
    method: 'get',
    path: '/workspaces/:wid/screens',
    tag: 'screens',
    summary: 'Screens of the workspace with their progress, newest first',
    access: member,
    auth: true,
    status: 200,
    response: 'Screen[]',
  },
  {
    method: 'get',
    path: '/screens/:id',
    tag: 'screens',
    summary:
      'One screen: status, progress (rows done, rows/s, seconds left), bad rows and the recorded choice',
    access: member,
    auth: true,
    status: 200,
    response: 'Screen',
  },
  {
    method: 'post',
    path: '/screens/:id/cancel',
    tag: 'screens',
    summary:
      'Stop a screen: queued chunks are skipped, finished chunks keep their rows (409 screen-not-running when finished)',
    access: editor,
    auth: true,
    status: 200,
    response: 'Screen',
    errors: [409],
  },
  {
    method: 'post',
    path: '/screens/:id/run',
    tag: 'screens',
    summary:
      'Run again: a finished screen of this software version is reused (`reused: true`); otherwise the unfinished chunks are queued (409 screen-running)',
    access: editor,
    auth: true,
    status: 200,
    response: 'ScreenRun',
    errors: [409],
  },
  {
    method: 'get',
    path: '/screens/:id/results',
    tag: 'screens',
    summary: 'Result rows, sorted, filtered and paged in the database',
    access: member,
    auth: true,
    status: 200,
    response: 'ScreenResultPage',
    query: resultQuery,
  },
  {
    method: 'get',
    path: '/screens/:id/results.csv',
    tag: 'screens',
    summary:
      'Every filtered result row as CSV (streamed; header cells carry units); the same filters as /results',
    access: member,
    auth: true,
    status: 200,
    query: resultQuery,
  },
  {
    method: 'post',
    path: '/screens/:id/results/:row/open-as-pair',
    tag: 'screens',
    summary:
      'Create a pair from one result row (by its line number in the file): derived parameters name their method and the screen',
    access: editor,
    auth: true,
    status: 201,
    response: 'Pair',
    compute: true,
  },

  {
    method: 'post',
    path: '/workspaces/:wid/series',
    tag: 'series',
    summary:
      'Create a driving-force series: measured k or log10 k against ΔG° (in energyUnit), optional σ(log10 k), temperature',
    access: editor,
    auth: true,
    body: 'SeriesInput',
    status: 201,
    response: 'Series',
  },
  {
    method: 'get',
    path: '/workspaces/:wid/series',
    tag: 'series',
    summary: 'Series of the workspace, last changed first',
    access: member,
    auth: true,
    status: 200,
    response: 'SeriesListItem[]',
  },
  {
    method: 'get',
    path: '/series/:id',
    tag: 'series',
    summary: 'One series with its points (canonical eV, log10 of s⁻¹) and its fit',
    access: member,
    auth: true,
    status: 200,
    response: 'Series',
  },
  {
    method: 'get',
    path: '/pairs/:id/series-points',
    tag: 'series',
    summary:
      "Measured points (ΔG° in eV, log10 k, σ of log10 k, series id and name) of the workspace's series that link this pair, in pairIds or through a point",
    access: member,
    auth: true,
    status: 200,
    response: 'PairSeriesPoint[]',
  },
  {
    method: 'put',
    path: '/series/:id',
    tag: 'series',
    summary:
      'Replace a series from `version` (stale: 409 version-conflict); the old fit is dropped',
    access: editor,
    auth: true,
    body: 'SeriesUpdate',
    status: 200,
    response: 'Series',
    errors: [409],
  },
  {
    method: 'post',
    path: '/series/:id/fit',
    tag: 'series',
    summary:
      'Fit λ and |H_AB| in log10 k (Levenberg–Marquardt; classical Marcus, or MLJ with the mode fixed) with SEs, correlation, residuals, AIC/BIC and the 95 % band; both models when ħω and λ_vib are given',
    access: editor,
    auth: true,
    body: 'SeriesFitRequest',
    status: 200,
    response: 'Series',
    compute: true,
  },
  {
    method: 'post',
    path: '/series/:id/apply',
    tag: 'series',
    summary:
      'Write the fitted λ and |H_AB| into pairs as derived parameters whose provenance points to the series (409 series-not-fitted)',
    access: editor,
    auth: true,
    body: 'SeriesApplyRequest',
    status: 200,
    response: 'SeriesApplied',
    errors: [409],
    compute: true,
  },
];

const regime = nullable({ type: 'string', enum: ['normal', 'activationless', 'inverted'] });

const seriesPointIn = obj(
  {
    label: str,
    deltaG0: { ...num, description: 'in the series energyUnit' },
    k: { ...num, description: 's⁻¹ (give k or log10k)' },
    log10k: num,
    sigmaLog10k: nullable({ ...num, minimum: 0 }),
    pairId: nullable(str),
  },
  ['deltaG0'],
);
const seriesFields = {
  name: str,
  temperature: num,
  temperatureUnit: { type: 'string', enum: ['K', 'degC'] },
  energyUnit: { type: 'string', enum: ['eV', 'meV', 'kJ/mol', 'kcal/mol', 'cm-1', 'hartree'] },
  notes: str,
  modelOptions: obj(
    { model: { type: 'string', enum: ['marcus', 'mlj'] }, hbarOmega: num, lambdaVib: num },
    [],
  ),
  pairIds: arr(str),
  points: arr(seriesPointIn),
};
const modelFit = obj({
  model: str,
  lambda: { ...num, description: 'eV (MLJ: the classical λ_s)' },
  coupling: { ...num, description: '|H_AB| in eV' },
  standardErrors: obj({ lambda: num, coupling: num }),
  correlation: num,
  covariance: arr(arr(num)),
  rmsLog10Residual: num,
  residuals: arr(num),
  aic: num,
  bic: num,
  band: obj({ deltaG0: arr(num), log10k: arr(num), lower: arr(num), upper: arr(num) }),
  warnings: arr(obj({ code: str, message: str })),
});

export const SCREEN_SCHEMAS: Record<string, Schema> = {
  ScreenOptions: obj({
    solvents: arr(
      obj(
        { key: str, name: str, epsilon: num, refractiveIndex: num, viscosityPaS: num, source: str },
        ['key', 'name'],
      ),
    ),
    scores: { type: 'object' },
    warnings: arr(str),
  }),
  ScreenPaste: obj({
    csv: {
      ...str,
      description: 'the CSV text (or send multipart field `file`, or a text/csv body)',
    },
  }),
  Screen: obj({
    id: str,
    workspaceId: str,
    name: str,
    status: { type: 'string', enum: [...SCREEN_STATUSES] },
    inputHash: str,
    softwareVersion: str,
    rowCount: int,
    badRowCount: int,
    badRows: arr(obj({ line: int, message: str })),
    badRowChoice: { type: 'string', enum: ['none', 'run-good', 'fixed'] },
    score: obj({
      kind: { type: 'string', enum: [...SCREEN_SCORE_KINDS] },
      floorEv: nullable(num),
      assumedHbarOmegaEv: nullable(num),
    }),
    progress: obj({
      rowsDone: int,
      rowCount: int,
      chunksDone: int,
      chunkCount: int,
      rowsPerSecond: nullable(num),
      etaSeconds: nullable(num),
    }),
    reusedFrom: nullable(str),
    error: nullable(str),
    uploadMs: nullable(num),
    createdAt: str,
    startedAt: nullable(str),
    finishedAt: nullable(str),
  }),
  ScreenRun: obj({ screen: ref('Screen'), reused: bool }),
  ScreenResultRow: obj(
    {
      ...Object.fromEntries(SCREEN_NUMERIC_COLUMNS.map((c) => [c, nullable(num)])),
      donor: str,
      acceptor: str,
      solvent: str,
      regimeCs: regime,
      regimeCr: regime,
      couplingRegime: nullable({
        type: 'string',
        enum: ['nonadiabatic', 'intermediate', 'adiabatic'],
        description: 'From the Landau–Zener γ with ν_n = 1e13 s⁻¹ (CALC-API.md couplingRegime)',
      }),
      warnings: arr({ type: 'string', enum: [...SCREEN_WARNINGS] }),
      // Only with a custom score in the request.
      customScore: num,
    },
    [
      ...SCREEN_NUMERIC_COLUMNS,
      'donor',
      'acceptor',
      'solvent',
      'regimeCs',
      'regimeCr',
      'couplingRegime',
      'warnings',
    ],
  ),
  ScreenResultPage: obj({
    items: arr(ref('ScreenResultRow')),
    total: int,
    offset: int,
    limit: int,
  }),
  SeriesInput: obj(seriesFields, ['name', 'temperature', 'points']),
  SeriesUpdate: obj({ ...seriesFields, version: { type: 'integer', minimum: 1 } }, [
    'name',
    'temperature',
    'points',
    'version',
  ]),
  SeriesFitRequest: obj(
    {
      model: { type: 'string', enum: ['marcus', 'mlj'] },
      hbarOmega: { ...num, description: 'eV (MLJ)' },
      lambdaVib: { ...num, description: 'eV (MLJ)' },
    },
    ['model'],
  ),
  SeriesApplyRequest: obj(
    { pairIds: arr(str), model: { type: 'string', enum: ['marcus', 'mlj'] } },
    ['pairIds'],
  ),
  SeriesApplied: obj({ pairs: arr(ref('Pair')) }),
  SeriesModelFit: modelFit,
  Series: obj({
    id: str,
    workspaceId: str,
    version: int,
    name: str,
    temperature: { ...num, description: 'K' },
    energyUnit: str,
    notes: str,
    modelOptions: { type: 'object' },
    pairIds: arr(str),
    points: arr(
      obj({
        label: str,
        deltaG0: { ...num, description: 'eV' },
        log10k: num,
        sigmaLog10k: nullable(num),
        pairId: nullable(str),
      }),
    ),
    fit: nullable(
      obj({
        model: str,
        hbarOmega: nullable(num),
        lambdaVib: nullable(num),
        fits: obj({ marcus: ref('SeriesModelFit'), mlj: ref('SeriesModelFit') }, []),
        preferred: nullable(str),
        fittedAt: str,
      }),
    ),
    createdAt: str,
    updatedAt: str,
  }),
  PairSeriesPoint: obj({
    seriesId: str,
    seriesName: str,
    label: str,
    deltaG0: { ...num, description: 'eV' },
    log10k: { ...num, description: 'log10 of k in s⁻¹' },
    sigmaLog10k: nullable({ ...num, minimum: 0 }),
    pairId: nullable(str),
  }),
  SeriesListItem: obj({
    id: str,
    name: str,
    temperature: num,
    pointCount: int,
    fitted: bool,
    updatedAt: str,
  }),
};
