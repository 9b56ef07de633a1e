/** Progress bars on the CLI's stderr (cli-progress), shown only on an interactive terminal and never with --quiet. */
import cliProgress from 'cli-progress';
import type { CliIO } from './io.js';

/** A counting bar `label ▮▮▮ done/total pct%`, or undefined when it should not be shown. */
export function countingProgressBar(
  io: CliIO,
  options: { total: number; label: string; quiet: boolean; minTotal?: number },
): { update(done: number): void; stop(): void } | undefined {
  if (options.quiet || !io.stderrIsTTY || options.total < (options.minTotal ?? 0)) return undefined;
  const stream = { isTTY: true, columns: 80, write: (s: string) => (io.stderr(s), true) } as unknown as NodeJS.WriteStream;
  const bar = new cliProgress.SingleBar({
    stream,
    format: `${options.label} {bar} {value}/{total}  {percentage}%`,
    barsize: 30,
    clearOnComplete: true,
    hideCursor: false,
  });
  bar.start(options.total, 0);
  return { update: (done) => bar.update(done), stop: () => bar.stop() };
}
