#!/usr/bin/env node
// The installed `skein` command: registers the TypeScript loader, then runs the CLI's source.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('../src/main.ts');
process.exitCode = await main(process.argv.slice(2));
