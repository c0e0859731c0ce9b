#!/usr/bin/env node
// The `doublet` executable (package.json "bin"). Plain JavaScript on purpose: node cannot run
// .ts files directly, so this shim first registers tsx's ESM loader and then imports the
// TypeScript command line. 'tsx/esm/api' is resolved from this file's own location (an ESM
// import resolves bare names from the importing file), so it works from any working directory
// and through the symlink npm makes for a bin.
import { register } from 'tsx/esm/api';

register();
await import('./cli.ts');
