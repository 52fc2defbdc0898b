#!/usr/bin/env node
// Thin launcher: the compiled CLI lives in dist/ (built by `npm run build`, which `npm ci` runs via prepare).
import { main } from '../dist/cli/main.js';

// A reader that stops early (`tankrunway analyze ... | head`) closes the pipe: that ends the output, it is
// not a failure worth a stack trace.
process.stdout.on('error', (error) => {
  if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw error;
});

process.exitCode = await main(process.argv.slice(2), {
  stdout: process.stdout,
  stderr: process.stderr,
  stdin: process.stdin,
});
