/**
 * The definitions of the commands whose code lives in their own modules (sweep, check, results
 * and the --cut options), without that code: each action imports its module when it runs. So
 * `peakwise --version`, `--help` or a mistyped option load commander and this file only, not the
 * mesher, the solver, the report or the model schema (docs/speed.md, start-up).
 */
import { Option, type Command } from 'commander';
import type { CliContext } from './common.js';
import { OTHER_CUT_COLUMNS } from '../sweep/cut-columns.js';

/** Adds --cut and the comparison options to a command. */
export function registerCutOptions(cmd: Command): Command {
  return cmd
    .option('--cut <spec>', 'stress along a line x1,y1:x2,y2[:n] (n samples, default 101) or around opening:<id>; writes cut.csv')
    .addOption(new Option('--compare <form>', 'add a closed-form solution to cut.csv').choices(['kirsch', 'lame', 'inglis']))
    .option('--remote <S>', 'remote tension for --compare kirsch|inglis')
    .option('--load-angle <deg>', 'direction of the remote tension from the x axis, degrees (default 0)')
    .option('--radius <a>', 'hole radius (kirsch) or inner radius (lame); default: the circular opening')
    .option('--outer-radius <b>', 'outer radius for --compare lame; default: a circular outline')
    .option('--centre <x,y>', 'centre of the hole or ring; default: the opening')
    .option('--inner-pressure <p>', 'internal pressure for --compare lame (default: the model\'s pressure on that opening)')
    .option('--outer-pressure <q>', 'external pressure for --compare lame (default: the model\'s pressure on the outline)')
    .option('--cut-other <file.csv>', `results along the cut from another analysis (columns x, y and one of ${OTHER_CUT_COLUMNS.join(', ')}): drawn on the cut plot and written to cut.csv with the difference`);
}

function collect(value: string, previous: string[]): string[] {
  return [...previous, value];
}

/** Adds the sweep command to the program (called once from buildProgram). */
export function registerSweep(program: Command, ctx: CliContext): void {
  program
    .command('sweep <model>')
    .description('repeat the study over parameter values (worker threads), resuming from earlier point files')
    .option('--vary <name=values>', 'a parameter and its values: r=0,2,4 or "r=0..20 by 2" (start..end by step); repeat for a grid', collect, [] as string[])
    .option('--jobs <n>', 'worker threads (default: one per core)')
    .option('--shard <k/n>', 'run only shard k of n (every n-th point, from point k); merge the point files of all shards and rerun for the whole sweep (docs/sweep.md)')
    .option('--levels <n>', 'refinement levels per site (overrides study.levels)')
    .option('--ratio <r>', 'element size ratio between levels (overrides study.ratio)')
    .option('--max-dofs <n>', 'cap on degrees of freedom per solve', '2000000')
    .option('--out <dir>', 'output folder (default out/<model-name>)')
    .option('--json', 'print the machine-readable result on stdout')
    .addOption(new Option('--order <n>', 'element order: 1 = 3-node, 2 = 6-node triangles').choices(['1', '2']))
    .option('--size <h>', 'target element size far from features (overrides mesh.size)')
    .option('--quiet', 'no progress bar, only the result')
    .option('--no-color', 'plain text without colours (also honours NO_COLOR)')
    .action(async (model: string, opts) => (await import('./sweep.js')).runSweepCommand(ctx, model, opts));
}

export function registerCheck(program: Command, ctx: CliContext): void {
  program
    .command('check')
    .description('run the built-in verification cases against published results and independent FE reference values')
    .option('--json', 'print { "cases": [...] } on stdout instead of the table')
    .option('--report <file>', 'also write the table as a self-contained HTML page')
    .option('--only <ids>', 'run only these cases (comma-separated ids, e.g. kirsch,lame)')
    .option('--quiet', 'no progress bar')
    .option('--no-color', 'plain text without colours (also honours NO_COLOR)')
    .action(async (opts) => (await import('./check.js')).runCheck(ctx, opts));
}

export function registerResults(program: Command): void {
  program
    .command('results <folder>')
    .description('tell whether a result folder holds one complete result set (exit 1 if not)')
    .option('--json', 'print the folder state as JSON')
    .action(async (folder: string, opts: { json?: boolean }) => (await import('./results.js')).runResults(folder, opts));
}
