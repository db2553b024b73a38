#!/usr/bin/env node
/**
 * The crossbound command line. Exit codes: 0 all good; 1 a disagreement, a broken bound or a failed
 * expectation; 2 bad input or usage (one line on stderr, no stack trace).
 */
import { Command, CommanderError, Option } from 'commander';
import { ModelError } from '../../corpus/format/load.js';
import { TemplateError } from '../external/template.js';
import { UsageError } from '../errors.js';
import { registerCommands } from './commands.js';

function fail(message: string): never {
  process.stderr.write(`crossbound: ${message.split('\n')[0]}\n`);
  process.exit(2);
}

async function main(argv: string[]): Promise<number> {
  const program = new Command('crossbound')
    .description('Cross-check solvers of time-bounded reachability in CTMCs, CTMDPs and CTMGs.')
    .version('0.1.0')
    .exitOverride()
    .configureOutput({ writeErr: (s) => process.stderr.write(s.replace(/^error: /, 'crossbound: ')) })
    .showHelpAfterError(false);
  program.addOption(new Option('--debug', 'print stack traces of internal errors').hideHelp());
  let code = 0;
  registerCommands(program, (c) => (code = c));
  try {
    await program.parseAsync(argv, { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : 2;
    if (e instanceof ModelError || e instanceof UsageError) fail(e.message);
    if (e instanceof TemplateError) fail(`--solver: ${e.message}`);
    if (process.env.CROSSBOUND_DEBUG) console.error(e);
    fail(`internal error: ${(e as Error).message} (set CROSSBOUND_DEBUG=1 for the trace)`);
  }
  return code;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => fail(String(e)),
);
