/** Fewest items for which a progress bar is worth showing. */
export const PROGRESS_MIN_ITEMS = 20;

export interface Progress {
  tick(): void;
  stop(): void;
}

const SILENT: Progress = { tick() {}, stop() {} };

/**
 * A progress bar on stderr (cli-progress) for long work: only when stderr is a terminal, `CI` is
 * not set, `--no-progress` was not given and there are at least {@link PROGRESS_MIN_ITEMS} items.
 * Otherwise silent, so logs and piped output stay clean.
 */
export async function startProgress(total: number, what: string, enabled: boolean): Promise<Progress> {
  if (!enabled || total < PROGRESS_MIN_ITEMS || !process.stderr.isTTY || process.env.CI) return SILENT;
  const { SingleBar, Presets } = await import('cli-progress');
  const bar = new SingleBar({ format: `${what} [{bar}] {value}/{total} {percentage}% eta {eta}s`, stream: process.stderr, hideCursor: true, clearOnComplete: true }, Presets.shades_classic);
  bar.start(total, 0);
  return { tick: () => bar.increment(), stop: () => bar.stop() };
}
