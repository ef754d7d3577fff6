/**
 * The registry of `meniscus` commands, in the order `meniscus --help` lists them. To add a
 * command, write one file exporting a `CommandDefinition` and add it here.
 */
import type { CommandDefinition } from './commandDefinition.ts';
import { dryingStressCommand } from './dryingStressCommand.ts';
import { evaporationCommand } from './evaporationCommand.ts';
import { maturityCommand } from './maturityCommand.ts';
import { simulateCommand } from './simulateCommand.ts';
import { strengthCommand } from './strengthCommand.ts';

export const COMMANDS: readonly CommandDefinition[] = [
  evaporationCommand,
  maturityCommand,
  strengthCommand,
  dryingStressCommand,
  simulateCommand,
];
