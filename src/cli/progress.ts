/** A progress bar on stderr when stderr is a terminal (cli-progress); a silent stand-in otherwise. */
import cliProgress from 'cli-progress';
import type { Io } from './io.js';

export interface Progress {
  update(done: number): void;
  stop(): void;
}

/**
 * `everyStep` draws every update at once: for a few slow steps (ngspice batches) that may each end
 * sooner than the bar's own redraw interval; without it, updates are drawn at most ten times a second.
 */
export function progressBar(
  io: Io,
  total: number,
  label: string,
  enabled: boolean,
  options: { readonly everyStep?: boolean } = {},
): Progress {
  if (!enabled || !io.stderrIsTTY) return { update: () => undefined, stop: () => undefined };
  const bar = new cliProgress.SingleBar(
    {
      format: `${label} {bar} {percentage}% | {value}/{total} | {rate}/s | {eta_formatted} left`,
      stream: process.stderr,
      hideCursor: true,
      clearOnComplete: true,
      etaBuffer: 50,
    },
    cliProgress.Presets.shades_classic,
  );
  const started = Date.now();
  bar.start(total, 0, { rate: '0' });
  return {
    update: (done) => {
      bar.update(done, { rate: Math.round(done / Math.max(1e-3, (Date.now() - started) / 1000)).toString() });
      if (options.everyStep === true) bar.render();
    },
    stop: () => bar.stop(),
  };
}
