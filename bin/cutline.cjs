#!/usr/bin/env node
// The `cutline` command: runs src/cli/main.ts through the on-demand bundle of run-ts.cjs.
'use strict';
const { bundled } = require('./run-ts.cjs');
require(bundled('src/cli/main.ts'));
