import { defineConfig } from 'tsup';

// Two entries: the core library (no Node built-ins, bundles for browsers) and the CLI (Node only).
export default defineConfig([
  {
    entry: { index: 'src/index.ts' },
    format: ['esm', 'cjs'],
    dts: true,
    sourcemap: true,
    clean: true,
    target: 'es2022',
    platform: 'neutral',
    external: ['fraction.js', 'pure-rand', 'zod'],
  },
  {
    // Node-only entry (worker threads); the worker file must sit beside it in dist/.
    entry: { node: 'src/node.ts', 'monte-carlo-worker.node': 'src/tolerance/monte-carlo-worker.node.ts' },
    format: ['esm'],
    dts: { entry: { node: 'src/node.ts' } },
    sourcemap: true,
    clean: false,
    target: 'node20',
    platform: 'node',
    external: ['fraction.js', 'pure-rand'],
  },
  {
    entry: { cli: 'src/cli/main.ts' },
    format: ['esm'],
    dts: false,
    sourcemap: true,
    clean: false,
    target: 'node20',
    platform: 'node',
    banner: { js: '#!/usr/bin/env node' },
  },
]);
