#!/usr/bin/env node
// The `knitbone` command. TypeScript sources run through tsx's loader, so a checkout
// works after `npm install` with no build step.
import { register } from 'tsx/esm/api';

register();
await import('../core/cli/main.ts');
