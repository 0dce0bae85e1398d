/**
 * The layer map of DEVELOPERS.md as rules: each layer of src/ imports only the layers above it in
 * the list below (the delay models may see the netlist's types, not its code), nothing but the CLI
 * and the ngspice runner touches Node's I/O, and no command imports another command.
 * Run with `npm run deps` (part of `npm test`).
 */
const LAYERS = [
  ['errors, units and caches', '^src/(errors\\.ts$|pair-cache\\.ts$|units/)'],
  ['schema', '^src/schema/'],
  ['process', '^src/process/'],
  ['cells', '^src/cells/'],
  ['delay', '^src/delay/'],
  ['netlist', '^src/netlist/'],
  ['sim', '^src/sim/'],
  ['measure', '^src/measure/'],
  ['switches', '^src/switches/'],
  ['checks', '^src/checks/'],
  ['variation', '^src/variation/'],
  ['analysis', '^src/analysis/'],
  ['report', '^src/report/'],
  ['render', '^src/render/'],
  ['spice and verilog', '^src/(spice|verilog)/'],
  ['cli', '^src/cli/'],
];

const layerRules = LAYERS.slice(0, -1).map(([name, path], i) => {
  const below = LAYERS.slice(i + 1).map(([, p]) => p);
  const rule = {
    name: `layer-${name.replace(/ /g, '-')}`,
    comment: `${name} imports only the layers above it in the layer map (DEVELOPERS.md)`,
    severity: 'error',
    from: { path },
    to: { path: below },
  };
  // The delay models bind to a compiled netlist: its type, never its code.
  if (name === 'delay') rule.to.dependencyTypesNot = ['type-only'];
  return rule;
});

module.exports = {
  forbidden: [
    ...layerRules,
    {
      name: 'spice-verilog-apart',
      comment: 'the ngspice and Verilog back ends do not import each other',
      severity: 'error',
      from: { path: '^src/(spice|verilog)/' },
      to: { path: '^src/(spice|verilog)/', pathNot: '^src/$1/' },
    },
    {
      name: 'pure-core',
      comment: 'only src/cli and the ngspice runner read or write files, start processes or threads',
      severity: 'error',
      from: { path: '^src/', pathNot: ['^src/cli/', '^src/spice/runner\\.ts$'] },
      to: { dependencyTypes: ['core'] },
    },
    {
      name: 'command-imports-command',
      comment: 'a command file imports shared modules of src/cli, never another command',
      severity: 'error',
      from: { path: '^src/cli/commands/' },
      to: { path: '^src/cli/commands/' },
    },
    {
      name: 'no-circular',
      comment: "modules do not import each other's code in a cycle (a cycle of type imports only is fine)",
      severity: 'error',
      from: {},
      to: { circular: true, viaOnly: { dependencyTypesNot: ['type-only'] } },
    },
    {
      name: 'not-to-unresolvable',
      comment: 'every import resolves',
      severity: 'error',
      from: {},
      to: { couldNotResolve: true },
    },
    {
      name: 'not-to-dev-dependency',
      comment: 'shipped code (src/) does not import a package that is only a devDependency',
      severity: 'error',
      from: { path: '^src/' },
      to: { dependencyTypes: ['npm-dev'] },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.json' },
    enhancedResolveOptions: {
      exportsFields: ['exports'],
      conditionNames: ['import', 'require', 'node', 'default', 'types'],
      mainFields: ['module', 'main', 'types', 'typings'],
    },
  },
};
