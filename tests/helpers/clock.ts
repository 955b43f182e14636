/** A clock tests move by hand; pass `clock.now` as the app's `now`. */
export function manualClock(start = '2026-06-01T12:00:00Z') {
  let t = new Date(start).getTime();
  return {
    now: () => new Date(t),
    advance(seconds: number) {
      t += seconds * 1000;
      return new Date(t);
    },
    set(iso: string) {
      t = new Date(iso).getTime();
    },
  };
}
