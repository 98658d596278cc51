/**
 * The command definitions and the run of one command line: what the main thread runs for the
 * short commands, and a worker thread for study and solve (src/cli/main.ts). Errors of ours become
 * one line and exit status 1, never a stack trace.
 */
import { Command, CommanderError, Option } from 'commander';
import { PeakwiseError, isPeakwiseError } from '../errors.js';
import { VERSION } from '../version.js';
import { maxDofsArgument } from './options.js';
import { registerCheck, registerCutOptions, registerResults, registerSweep } from './register.js';
import type { CliContext } from './common.js';

// Only commander and the command definitions load up front: each action imports the modules it
// needs when it runs, so --version and --help start in well under 0.1 s (docs/speed.md).
const commands = (): Promise<typeof import('./commands.js')> => import('./commands.js');

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
  ).action(async (model: string, opts) => (await import('./mesh-command.js')).runMesh(ctx, model, opts));

  registerCutOptions(sharedOptions(
    program
      .command('solve <model>')
      .description('one solve: displacements, stresses, reaction check, error estimate, field.csv')
      .option('--export-matrix <file>', 'write the stiffness matrix of the free dofs (Matrix Market, lower triangle)')
      .option('--export-load <file>', 'write the load vector of the free dofs (Matrix Market)')
      .option('--adapt <percent>', 'refine adaptively until the estimated energy error is below this')
      .option('--max-dofs <n>', 'cap on degrees of freedom (a whole number)', maxDofsArgument, '2000000')
      .option('--report', 'also write report.html')
      .option('--case <name>', 'show this load case or combination (default: the first case)'),
  )).action(async (model: string, opts) => (await commands()).runSolve(ctx, model, opts));

  registerCutOptions(sharedOptions(
    program
      .command('study <model>')
      .description('study the sites (theory features, stress maxima above 1.3 × the median, or the listed points): refine each level after level and give a verdict')
      .option('--levels <n>', 'refinement levels per site (overrides study.levels)')
      .option('--ratio <r>', 'element size ratio between levels (overrides study.ratio)')
      .option('--max-dofs <n>', 'cap on degrees of freedom per solve (a whole number)', maxDofsArgument, '2000000')
      .option('--case <name>', 'show this load case or combination instead of the envelope (study.json holds every case)')
      .option('--jobs <n>', 'worker threads for the levels (default: one per core for a long ladder, else one; 1 solves every level in one thread)')
      .option('--watch', 'stay running: study again whenever the model (or a file it reads) is saved, and serve the report')
      .option('--port <n>', 'with --watch: the local port of the report (default: any free one)'),
  )).action(async (model: string, opts) => {
    if (opts.port !== undefined && !opts.watch) throw new PeakwiseError('usage', '--port serves the report of --watch; add --watch or leave --port out');
    // watch mode (and its server) loads only when asked for
    return opts.watch ? (await import('./watch.js')).watchStudy(ctx, model, opts) : (await commands()).runStudy(ctx, model, opts);
  });

  registerSweep(program, ctx);
  registerCheck(program, ctx);
  registerResults(program);

  return program;
}

/** Options of earlier versions and their present names: an old option gets a hint, not "unknown option". */
const RENAMED_OPTIONS: Readonly<Record<string, string>> = { '--path': '--cut' };

function renamedOptionHint(argv: readonly string[]): string | undefined {
  for (const a of argv.slice(2)) {
    const name = a.split('=')[0];
    const now = RENAMED_OPTIONS[name];
    if (now !== undefined) return `option ${name} is now called ${now} (same meaning); rename it`;
  }
  return undefined;
}

/** Parse `argv` and run its command; resolves to the exit status. */
export async function runCommandLine(argv: string[]): Promise<number> {
  const hint = renamedOptionHint(argv);
  if (hint !== undefined) {
    process.stderr.write(`peakwise: ${hint}\n`);
    return 1;
  }
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    // a command ran, so the output-set module is loaded already; help and version never get here
    (await import('./output-set.js')).closeOutputSets('done'); // the result set's manifest, written last
    return 0;
  } catch (e) {
    if (e instanceof CommanderError) {
      // help and version are "errors" to commander with exit code 0
      return e.exitCode === 0 ? 0 : 1;
    }
    const { closeOutputSets } = await import('./output-set.js');
    const { describeError } = await import('./report-error.js');
    const { StudyInterrupted } = await import('./common.js');
    if (e instanceof StudyInterrupted) {
      try {
        closeOutputSets('interrupted');
      } catch (e2) {
        if (isPeakwiseError(e2)) process.stderr.write(`peakwise: ${describeError(e2, ctx.file, ctx.model)}\n`);
      }
      return 130;
    }
    closeOutputSets('failed');
    if (isPeakwiseError(e)) {
      process.stderr.write(`peakwise: ${describeError(e, ctx.file, ctx.model)}\n`);
      return 1;
    }
    const msg = e instanceof Error ? e.message : String(e);
    process.stderr.write(`peakwise: internal error: ${msg}\n(this is a bug in peakwise, not in your model; please report it with the model file)\n`);
    return 2;
  }
}
