/**
 * Layer rules of rateloom, checked by dependency-cruiser (tests/house/layers.test.ts runs it in
 * `npm test`). Layers are listed bottom first; a module may import its own layer and the layers
 * listed before it, never one listed after it (no upward arrows). A few layers are held tighter
 * (see NARROW). The picture: docs/architecture.md.
 */

/** Folders of src/ from the bottom up (src/version.ts counts as core, src/index.ts is the top). */
const LAYERS = [
  'core',
  'units',
  'numerics',
  'chemistry',
  'kinetics',
  'reactors',
  'pellets',
  'data',
  'study',
  'onboard',
  'estimation',
  'report',
  'design',
  'workflow',
  'planning',
  'parallel',
  'api',
];

/** Layers that may import only the layers named here (besides themselves). */
const NARROW = {
  // numerical methods know no chemistry, kinetics, reactors or data
  numerics: ['core'],
  // estimation knows models only through RegressionModel (src/estimation/model.ts)
  estimation: ['core', 'numerics'],
  // reports only format the view models they are handed
  report: ['core', 'units'],
};

const dir = (name) => `^src/${name}/`;
const anyOf = (names) => `^src/(${names.join('|')})/`;

const upward = LAYERS.map((layer, i) => ({
  name: `no-upward-from-${layer}`,
  comment: `src/${layer}/ may import only ${LAYERS.slice(0, i + 1).join(', ')} (layers flow one way)`,
  severity: 'error',
  from: { path: dir(layer) },
  to: { path: [`${anyOf(LAYERS.slice(i + 1))}`, '^src/index\\.ts$'] },
}));
// nothing inside src/ imports the public API module itself
upward.forEach((rule, i) => {
  if (i === LAYERS.length - 1) rule.to.path = ['^src/index\\.ts$'];
});

const narrow = Object.entries(NARROW).map(([layer, allowed]) => ({
  name: `narrow-${layer}`,
  comment: `src/${layer}/ imports only ${allowed.join(', ')}`,
  severity: 'error',
  from: { path: dir(layer) },
  to: { path: '^src/', pathNot: [dir(layer), anyOf(allowed), '^src/version\\.ts$'] },
}));

module.exports = {
  forbidden: [
    ...upward,
    ...narrow,
    {
      name: 'cli-only-public-api',
      comment: 'cli/ calls the library only through its public API, src/index.ts',
      severity: 'error',
      from: { path: '^cli/' },
      to: { path: '^src/', pathNot: '^src/index\\.ts$' },
    },
    {
      name: 'src-never-imports-cli',
      comment: 'the library knows nothing of the command line',
      severity: 'error',
      from: { path: '^src/' },
      to: { path: '^cli/' },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: '(^|/)node_modules/|^dist/' },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.json' },
    enhancedResolveOptions: { extensions: ['.ts', '.js', '.json'] },
  },
};
