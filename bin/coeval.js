#!/usr/bin/env node
// Thin launcher: the compiled CLI lives in dist/ (built by `npm install` through the prepare script).
import { main } from '../dist/src/cli/main.bundle.js';
main(process.argv.slice(2)).then((code) => { process.exitCode = code; });
