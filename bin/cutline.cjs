#!/usr/bin/env node
// The `cutline` command: runs src/cli/main.ts through the on-demand bundle of run-ts.cjs.
'use strict';
// A check runs each of its long loops once, over up to millions of rows: V8 then compiles a
// loop while it runs (on-stack replacement) and, by default, keeps interpreting it until the
// optimised code is ready on another thread. Compiling it on the spot costs less CPU in all
// (measured in README "Speed"); it only changes when code is optimised, never a result.
require('v8').setFlagsFromString('--no-concurrent-osr');
const { bundled } = require('./run-ts.cjs');
require(bundled('src/cli/main.ts'));
