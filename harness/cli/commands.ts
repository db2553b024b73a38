/** The subcommands, each a thin layer over a library function. */
import type { Command } from 'commander';
import { registerBench } from './bench.js';
import { registerCheck } from './check.js';
import { registerFuzz } from './fuzz.js';
import { registerMerge } from './merge.js';
import { registerExport, registerSolve, registerValidate } from './solve.js';

export type SetExit = (code: number) => void;

export function registerCommands(program: Command, setExit: SetExit): void {
  registerSolve(program, setExit);
  registerCheck(program, setExit);
  registerMerge(program, setExit);
  registerFuzz(program, setExit);
  registerBench(program, setExit);
  registerValidate(program, setExit);
  registerExport(program, setExit);
}
