#!/usr/bin/env node
// Entry point: runs the TypeScript sources through tsx, so a clone works after `npm ci`
// with no separate build step and worker processes run the same code as the CLI.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../runner/cli/main.ts');
process.exitCode = await main(process.argv.slice(2));
