/** Every CLI command, in help order. A new command is one file in this folder plus one line here. */
import type { Command } from 'commander';
import type { CommandContext } from '../context.js';
import { registerPair } from './pair.js';
import { registerDerive } from './derive.js';
import { registerCheck } from './check.js';
import { registerCluster } from './cluster.js';
import { registerCurve } from './curve.js';
import { registerDensity } from './density.js';
import { registerSpecies } from './species.js';
import { registerTable } from './table.js';

export const commandRegistrars: Array<(program: Command, ctx: CommandContext) => void> = [
  registerPair,
  registerCluster,
  registerCurve,
  registerDensity,
  registerDerive,
  registerCheck,
  registerSpecies,
  registerTable,
];
