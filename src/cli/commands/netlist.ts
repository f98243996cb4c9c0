import type { Command } from 'commander';
import { parseConnections, renderBuildSheet, renderGraphNetlist, renderNetlist, resolveCircuitLoad } from '../../circuit/index.js';
import { InputError, type InputProblem, problemAt } from '../../errors/index.js';
import { enumerateWirings, findWiring, vocabularyOf } from '../../wiring/index.js';
import { type CircuitOptionText, addCircuitOptions, parseCircuitOptions } from '../circuit-options.js';
import type { Io } from '../io.js';
import { readGuitarFile } from '../read-guitar.js';
import { appendAll } from '../../math/index.js';

interface NetlistCommandOptions extends CircuitOptionText {
  readonly buildSheet?: boolean;
}

export function registerNetlist(program: Command, io: Io): void {
  const command = program
    .command('netlist')
    .description('a SPICE netlist of one wiring (ngspice -b runs it), or its build sheet')
    .argument('<guitar>', 'guitar file (JSON)')
    .argument('<wiring>', 'a wiring such as "neck + ~bridge", its number such as w9, or a connection list such as "neck.finish = hot, neck.start = ground"')
    .option('--build-sheet', 'print the wiring in words to solder from, with cautions, instead of the netlist');
  addCircuitOptions(command).action((file: string, expression: string, options: NetlistCommandOptions) => {
    const guitar = readGuitarFile(file, io.cwd);
    const problems: InputProblem[] = [];
    const overrides = parseCircuitOptions(options, guitar, problems);
    // A connection list (any joint of leads, bridge networks included) is told apart by its "=".
    if (expression.includes('=')) {
      let graph;
      try {
        graph = parseConnections(guitar, expression, '<wiring>');
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        appendAll(problems, error.problems);
      }
      if (options.buildSheet) problems.push(problemAt('--build-sheet', 'a wiring in +, // and ~ notation (build sheets of connection lists are not written yet)', expression));
      if (problems.length > 0 || graph === undefined) throw new InputError(problems);
      io.stdout(renderGraphNetlist(guitar, graph, expression, overrides));
      return;
    }
    let wiring;
    try {
      wiring = findWiring(expression, enumerateWirings(guitar.elements), vocabularyOf(guitar), '<wiring>');
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      appendAll(problems, error.problems);
    }
    if (problems.length > 0 || wiring === undefined) throw new InputError(problems);
    if (!options.buildSheet && resolveCircuitLoad(guitar, overrides).silent) {
      io.stderr('coilbench: note: with the volume at 0 the output is shorted to ground; the netlist prints the magnitude (0), not dB\n');
    }
    io.stdout(options.buildSheet ? renderBuildSheet(guitar, wiring) : renderNetlist(guitar, wiring, overrides));
  });
}
