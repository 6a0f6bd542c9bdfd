import type { Command } from '../command';
import { paramsCommand } from './params';
import { envelopeCommand } from './envelope';
import { pointCommand } from './point';
import { sizeCommand } from './size';
import { simulateCommand } from './simulate';
import { tuneCommand } from './tune';
import { datasheetCommand } from './datasheet';
import { importFluxMapCommand } from './import-flux-map';
import { importDutyCycleCommand } from './import-duty-cycle';
import { efficiencyCommand } from './efficiency';
import { continuousCommand } from './continuous';
import { overloadCommand } from './overload';
import { dutyCycleCommand } from './duty-cycle';
import { currentTableCommand } from './current-table';
import { cornersCommand } from './corners';
import { toleranceSampleCommand } from './tolerance-sample';
import { compareCommand } from './compare';

/** Every command of the CLI, in the order `help` lists them. Add a command by importing it here. */
export const COMMANDS: Command[] = [
  paramsCommand,
  envelopeCommand,
  pointCommand,
  efficiencyCommand,
  continuousCommand,
  overloadCommand,
  dutyCycleCommand,
  sizeCommand,
  cornersCommand,
  toleranceSampleCommand,
  compareCommand,
  simulateCommand,
  tuneCommand,
  currentTableCommand,
  datasheetCommand,
  importFluxMapCommand,
  importDutyCycleCommand,
];
