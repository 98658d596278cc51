#!/usr/bin/env node
/**
 * peakwise command line. Wires the stages to commands; the only place that touches argv,
 * files and the console. Errors of ours become one line and exit status 1, never a stack trace.
 */
import { Command, CommanderError, Option } from 'commander';
import { isPeakwiseError } from '../errors.js';
import { describeError } from './report-error.js';
import { runMesh, runSolve, runStudy, type CliContext } from './commands.js';
import { VERSION } from '../version.js';
import { registerSweep } from './sweep.js';
import { registerCheck } from './check.js';

const ctx: CliContext = { file: undefined, model: undefined };

function sharedOptions(cmd: Command): Command {
  return cmd
    .option('--out <dir>', 'output folder (default out/<model-name>)')
    .option('--json', 'print the machine-readable result on stdout')
    .addOption(new Option('--order <n>', 'element order: 1 = 3-node, 2 = 6-node triangles').choices(['1', '2']))
    .option('--size <h>', 'target element size far from features (overrides mesh.size)')
    .option('--quiet', 'no progress bar, only the result')
    .option('--no-color', 'plain text without colours (also honours NO_COLOR)');
}

export function buildProgram(): Command {
  const program = new Command();
  program
    .name('peakwise')
    .description('Plate-detail finite elements that tell converging stress concentrations from singularities.')
    .version(VERSION, '-v, --version', 'print the version')
    .showHelpAfterError('(run peakwise --help for the commands)')
    .exitOverride();

  sharedOptions(
    program
      .command('mesh <model>')
      .description('mesh a model and print counts and quality')
      .option('--svg <file>', 'draw the mesh as SVG (boundary tags coloured)'),
  ).action(async (model: string, opts) => runMesh(ctx, model, opts));

  sharedOptions(
    program
      .command('solve <model>')
      .description('one solve: displacements, stresses, reaction check, error estimate, field.csv')
      .option('--export-matrix <file>', 'write the stiffness matrix of the free dofs (Matrix Market, lower triangle)')
      .option('--export-load <file>', 'write the load vector of the free dofs (Matrix Market)')
      .option('--adapt <percent>', 'refine adaptively until the estimated energy error is below this')
      .option('--max-dofs <n>', 'cap on degrees of freedom', '2000000')
      .option('--report', 'also write report.html'),
  ).action(async (model: string, opts) => runSolve(ctx, model, opts));

  sharedOptions(
    program
      .command('study <model>')
      .description('find every hot spot, refine it level after level and give a verdict')
      .option('--levels <n>', 'refinement levels per spot (overrides study.levels)')
      .option('--ratio <r>', 'element size ratio between levels (overrides study.ratio)'),
  ).action(async (model: string, opts) => runStudy(ctx, model, opts));

  registerSweep(program, ctx);
  registerCheck(program, ctx);

  return program;
}

async function main(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    return 0;
  } catch (e) {
    if (e instanceof CommanderError) {
      // help and version are "errors" to commander with exit code 0
      return e.exitCode === 0 ? 0 : 1;
    }
    if (isPeakwiseError(e)) {
      process.stderr.write(`peakwise: ${describeError(e, ctx.file, ctx.model)}\n`);
      return 1;
    }
    const msg = e instanceof Error ? e.message : String(e);
    process.stderr.write(`peakwise: internal error: ${msg}\n(this is a bug in peakwise, not in your model; please report it with the model file)\n`);
    return 2;
  }
}

main(process.argv).then((code) => {
  process.exitCode = code;
});
