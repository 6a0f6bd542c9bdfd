import type { Command } from '../command';
import { envelopeCommand } from './envelope';
import { pointCommand } from './point';

/** Every command of the CLI, in the order `help` lists them. Add a command by importing it here. */
export const COMMANDS: Command[] = [
  envelopeCommand,
  pointCommand,
];
