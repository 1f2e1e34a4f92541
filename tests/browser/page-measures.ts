import type { Page } from 'playwright-core';

/*
 * What the browser tests measure inside the page. The root tsconfig has no DOM
 * types, so the few browser objects used are described here by their shape.
 */
interface CanvasLike {
  width: number;
  height: number;
  getContext(kind: '2d'): { getImageData(x: number, y: number, w: number, h: number): { data: ArrayLike<number> } } | null;
}
type StyleReader = { getComputedStyle(element: unknown): { fontSize: string } };

export interface InkCount {
  /** Pixels painted at all (alpha above zero). */
  painted: number;
  /** Pixels within a small distance of each colour asked for, by its hex code. */
  near: Record<string, number>;
}

/**
 * Counts the painted pixels of a chart's canvas, and those close to given
 * colours, so a test can tell "the series was drawn" from "only the grid was".
 */
export function inkOf(page: Page, chartSelector: string, colours: string[]): Promise<InkCount> {
  return page.locator(`${chartSelector} canvas`).evaluate((element, hexes) => {
    const canvas = element as unknown as CanvasLike;
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('the canvas has no 2-D context');
    const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    const wanted = hexes.map((hex) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)));
    const near: Record<string, number> = Object.fromEntries(hexes.map((h) => [h, 0]));
    let painted = 0;
    for (let i = 0; i < data.length; i += 4) {
      if (data[i + 3] === 0) continue;
      painted += 1;
      wanted.forEach(([r, g, b], n) => {
        if (Math.abs(data[i] - r) + Math.abs(data[i + 1] - g) + Math.abs(data[i + 2] - b) < 40 && data[i + 3] > 200) near[hexes[n]] += 1;
      });
    }
    return { painted, near };
  }, colours);
}

/** The rendered font size of the first element matching the selector, in CSS pixels. */
export function fontSizeOf(page: Page, selector: string): Promise<number> {
  return page
    .locator(selector)
    .first()
    .evaluate((element) => parseFloat((globalThis as unknown as StyleReader).getComputedStyle(element).fontSize));
}
