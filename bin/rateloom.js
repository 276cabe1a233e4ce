#!/usr/bin/env node
// Entry point for the `rateloom` command: registers the TypeScript loader (tsx), then runs the CLI.
import { register } from 'tsx/esm/api';
register();
await import('../cli/main.ts');
