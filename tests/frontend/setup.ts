// jsdom lacks what a browser gives uPlot and Quasar; these stand-ins let
// components mount. They draw nothing, so no test may judge a chart by pixels.
Object.defineProperty(window, 'matchMedia', {
  writable: true,
  value: (query: string) => ({
    matches: false,
    media: query,
    onchange: null,
    addListener: () => {},
    removeListener: () => {},
    addEventListener: () => {},
    removeEventListener: () => {},
    dispatchEvent: () => false,
  }),
});

class QuietResizeObserver {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
}
// Assigned, not stubbed, so tests that unstub their own globals keep these.
globalThis.ResizeObserver = QuietResizeObserver as unknown as typeof ResizeObserver;

class QuietPath2D {
  moveTo(): void {}
  lineTo(): void {}
  rect(): void {}
  arc(): void {}
  closePath(): void {}
  bezierCurveTo(): void {}
  addPath(): void {}
}
globalThis.Path2D = QuietPath2D as unknown as typeof Path2D;

// A 2-D context that accepts every call and every property, as uPlot only draws.
function quietContext(canvas: HTMLCanvasElement): CanvasRenderingContext2D {
  const state: Record<string | symbol, unknown> = { canvas };
  return new Proxy(state, {
    get: (target, key) => {
      if (key in target) return target[key];
      if (key === 'measureText') return () => ({ width: 0 });
      if (key === 'getLineDash') return () => [];
      return () => undefined;
    },
    set: (target, key, value) => {
      target[key] = value;
      return true;
    },
  }) as unknown as CanvasRenderingContext2D;
}

HTMLCanvasElement.prototype.getContext = function getContext(this: HTMLCanvasElement) {
  return quietContext(this);
} as unknown as typeof HTMLCanvasElement.prototype.getContext;
