import cliProgress from 'cli-progress';

/** A progress bar on stderr; silent unless stderr is a terminal and neither --quiet nor --json. */
export interface Progress {
  /** `label` fills the text after the counts */
  update(done: number, total: number, label: string): void;
  stop(): void;
}

export function progressBar(opts: { quiet?: boolean; json?: boolean }, unit: string): Progress {
  if (opts.quiet || opts.json || process.stderr.isTTY !== true) return { update() {}, stop() {} };
  const bar = new cliProgress.SingleBar(
    { stream: process.stderr, format: `  {bar} {value}/{total} ${unit}  {label}`, hideCursor: true, clearOnComplete: true, barsize: 30 },
    cliProgress.Presets.shades_classic,
  );
  let started = false;
  return {
    update(done, total, label) {
      if (!started) {
        bar.start(total, done, { label });
        started = true;
      } else {
        bar.setTotal(total);
        bar.update(done, { label });
      }
    },
    stop() {
      if (started) bar.stop();
    },
  };
}
