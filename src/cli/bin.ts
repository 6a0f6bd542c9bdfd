#!/usr/bin/env node
// The command line's process entry (the built `torquewise` bin): run main on argv, set the exit code.
import { runProcess } from './index';

runProcess();
