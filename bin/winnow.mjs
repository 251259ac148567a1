#!/usr/bin/env node
// The `winnow` command: registers the tsx TypeScript loader, then runs the CLI over src/core.
import { register } from 'tsx/esm/api';

register();
const { main } = await import(new URL('../src/cli/winnow.ts', import.meta.url).href);
process.exitCode = await main(process.argv.slice(2));
