import type { Command } from '../command';

/** Every command of the CLI, in the order `help` lists them. Add a command by importing it here. */
export const COMMANDS: Command[] = [];
