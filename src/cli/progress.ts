/**
 * The sweep's progress line on a terminal (stderr): points done of total, rate, time left, and
 * the failed count. Shown only when stderr is a terminal and the user did not ask for --quiet.
 */
import { Presets, SingleBar } from 'cli-progress';

export interface Progress {
  /** `done` counts every point of the block, including those already in the file before a resume */
  update(done: number, failed: number): void;
  stop(): void;
}

const silent: Progress = { update: () => {}, stop: () => {} };

export function createProgress(total: number, alreadyDone: number, enabled: boolean, stream: NodeJS.WriteStream = process.stderr): Progress {
  if (!enabled || !stream.isTTY || total <= 0) return silent;
  const bar = new SingleBar(
    {
      format: 'sweep {bar} {value}/{total} points | {rate} pt/s | ETA {eta_formatted} | {failed} failed',
      stream,
      fps: 5,
      etaBuffer: 50,
      etaAsynchronousUpdate: true,
      hideCursor: true,
      barsize: 24,
    },
    Presets.shades_classic,
  );
  const t0 = performance.now();
  bar.start(total, alreadyDone, { rate: '–', failed: 0 });
  let stopped = false;
  return {
    update(done: number, failed: number) {
      if (stopped) return;
      const s = (performance.now() - t0) / 1000;
      const rate = s > 0.2 ? ((done - alreadyDone) / s).toPrecision(3) : '–';
      bar.update(done, { rate, failed });
    },
    stop() {
      if (stopped) return;
      stopped = true;
      bar.stop();
    },
  };
}
