/**
 * A stand-in for a canvas 2D context that draws nothing and counts every
 * call, so a test can bound the work of a frame by counting, not timing.
 */
export interface CountingContext {
  ctx: CanvasRenderingContext2D;
  calls: () => number;
  reset: () => void;
  /** longest text measured or drawn */
  longestText: () => number;
}

export function countingContext(): CountingContext {
  let calls = 0;
  let longest = 0;
  const seeText = (t: unknown) => {
    if (typeof t === 'string') longest = Math.max(longest, t.length);
  };
  const target: Record<string | symbol, unknown> = {};
  const ctx = new Proxy(target, {
    get(_t, key) {
      if (key in target) return target[key];
      if (key === 'measureText') {
        return (t: string) => {
          calls++;
          seeText(t);
          return { width: 6 * String(t).length };
        };
      }
      return (...args: unknown[]) => {
        calls++;
        seeText(args[0]);
      };
    },
    set(_t, key, value) {
      target[key] = value;
      return true;
    },
  }) as unknown as CanvasRenderingContext2D;
  return {
    ctx,
    calls: () => calls,
    reset: () => {
      calls = 0;
      longest = 0;
    },
    longestText: () => longest,
  };
}
