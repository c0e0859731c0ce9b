#!/usr/bin/env node
// The `doublet` executable (package.json "bin"). Runs the compiled command line in dist/server,
// compiling it first when it is missing or older than the sources (scripts/build.mjs), so no
// TypeScript is transpiled at start-up. The build script is found from this file's own location,
// so this works from any working directory and through the symlink npm makes for a bin.
// `npm run dev`-style work on the sources: `node --import tsx server/cli.ts <command>`.
import { runBuilt } from '../scripts/build.mjs';

await runBuilt('cli');
