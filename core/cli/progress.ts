import type { ProgressEvent } from '../host/request';

/**
 * A progress bar on stderr when stderr is a terminal; silent when piped (design.md section 9).
 * Shows the stage, a bar, done/total and an estimate of time left.
 */
export function terminalProgress(stream: NodeJS.WriteStream = process.stderr): {
  onProgress: (e: ProgressEvent) => void;
  finish: () => void;
} {
  if (!stream.isTTY) return { onProgress: () => {}, finish: () => {} };
  const started = Date.now();
  let stage = '';
  let stageStart = started;
  let lastDraw = 0;
  let drawn = false;
  const onProgress = (e: ProgressEvent): void => {
    const now = Date.now();
    if (e.stage !== stage) {
      stage = e.stage;
      stageStart = now;
    }
    if (now - lastDraw < 100 && e.done < e.total) return;
    lastDraw = now;
    const width = 28;
    const frac = e.total > 0 ? Math.min(1, e.done / e.total) : 0;
    const filled = Math.round(frac * width);
    const elapsed = (now - stageStart) / 1000;
    const left = frac > 0 && frac < 1 ? (elapsed / frac) * (1 - frac) : 0;
    const eta = frac > 0 && frac < 1 ? ` ~${formatSeconds(left)} left` : '';
    const line = `${e.stage} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${e.done}/${e.total}${eta}`;
    stream.write(`\r\x1b[2K${line.slice(0, (stream.columns ?? 100) - 1)}`);
    drawn = true;
  };
  const finish = (): void => {
    if (drawn) stream.write('\r\x1b[2K');
  };
  return { onProgress, finish };
}

function formatSeconds(s: number): string {
  if (s < 60) return `${Math.ceil(s)} s`;
  const m = Math.floor(s / 60);
  return `${m} min ${Math.round(s - m * 60)} s`;
}
