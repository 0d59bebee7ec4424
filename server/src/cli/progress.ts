/** A progress bar on standard error for long runs, only when it is a terminal. */
import { SingleBar } from 'cli-progress';

export interface Progress {
  update(done: number, total: number): void;
  stop(): void;
}

const SILENT: Progress = { update: () => undefined, stop: () => undefined };

export function progressBar(stream: NodeJS.WritableStream & { isTTY?: boolean }, total: number, label: string, enabled: boolean): Progress {
  if (!enabled || stream.isTTY !== true || total < 20) return SILENT;
  const bar = new SingleBar({
    stream,
    format: `${label} [{bar}] {value}/{total} notes  {eta_formatted} left`,
    hideCursor: true,
    clearOnComplete: true,
    barsize: 30,
  });
  bar.start(total, 0);
  return {
    update: (done) => bar.update(done),
    stop: () => bar.stop(),
  };
}
