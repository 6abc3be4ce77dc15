/**
 * Shares one reading among callers without ever answering with a reading taken before the caller
 * asked: a caller who asks while no reading is in flight starts one; callers who ask while one is
 * in flight wait for the next, which starts as soon as that one ends and is shared by all of them.
 * At most one reading is in flight, so a burst of requests costs a couple of readings, not one each,
 * and still each sees every write that was committed before it asked. A failed reading fails the
 * callers who shared it; the next caller reads again.
 */
export function freshRead<T>(read: () => Promise<T>): () => Promise<T> {
  let inFlight: Promise<T> | undefined;
  let queued: Promise<T> | undefined;

  const start = (): Promise<T> => {
    const reading = read();
    inFlight = reading;
    const done = () => {
      if (inFlight === reading) inFlight = undefined;
    };
    reading.then(done, done);
    return reading;
  };

  return () => {
    if (!inFlight) return start();
    queued ??= inFlight
      .then(
        () => undefined,
        () => undefined,
      )
      .then(() => {
        queued = undefined;
        return start();
      });
    return queued;
  };
}
