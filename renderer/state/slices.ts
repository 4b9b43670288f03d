/**
 * Long work on the renderer's main thread, cut into slices of about `sliceMs` with the browser free
 * to paint and handle input between them: the work is a generator, stepped until the slice's time
 * is up, then continued in the next task (a MessageChannel message: no 4 ms timer clamp).
 *
 * Used for the panels Sections shows after its first paint (ui/sections/useAfterPaint.ts) and for
 * serialising the recovery copy (projectJson.ts).
 */
export function runInSlices<T>(begin: () => Generator<unknown, T>, done: (value: T) => void, sliceMs: number): () => void {
  let stopped = false;
  let work: Generator<unknown, T> | null = null;
  const channel = new MessageChannel();
  const stop = (): void => {
    stopped = true;
    channel.port1.close();
  };
  channel.port1.onmessage = () => {
    if (stopped) return;
    const until = performance.now() + sliceMs;
    work ??= begin();
    for (;;) {
      const next = work.next();
      if (next.done === true) {
        stop();
        done(next.value);
        return;
      }
      if (performance.now() >= until) break;
    }
    channel.port2.postMessage(null);
  };
  channel.port2.postMessage(null);
  return stop;
}
