// Where the fill, the watch line and the brim sit on a load bar. The bar
// reaches past the brim so an overfull sketch visibly spills over it.

/** The load at the right-hand end of the bar: 125 %, so the brim sits at 80 % of its length. */
export const BAR_END_LOAD = 1.25;

export interface LoadBarGeometry {
  /** Share of the bar's length, 0–100, that the fill covers. */
  fillPercent: number;
  brimPercent: number;
  watchPercent: number;
  /** True when the load is past the end of the bar and the fill is cut short. */
  beyondEnd: boolean;
}

const share = (load: number) => Math.round((Math.min(Math.max(load, 0), BAR_END_LOAD) / BAR_END_LOAD) * 1000) / 10;

export function loadBarGeometry(load: number | null, watchLine: number): LoadBarGeometry {
  const known = load !== null && Number.isFinite(load);
  return {
    fillPercent: known ? share(load) : 0,
    brimPercent: share(1),
    watchPercent: share(watchLine),
    beyondEnd: known && load > BAR_END_LOAD,
  };
}
