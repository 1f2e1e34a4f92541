// Types for the two independent sketch libraries the tests compare against; they ship none.
declare module 'count-min-sketch' {
  interface CountMinSketchLibrary {
    width: number;
    depth: number;
    update(key: string | number, count: number): void;
    query(key: string | number): number;
  }
  /** (ε, δ): accuracy and probability of a wrong answer, as its README names them. */
  function createCountMinSketch(epsilon?: number, probError?: number): CountMinSketchLibrary;
  export default createCountMinSketch;
}

declare module 'datalib-sketch' {
  interface DatalibCountMin {
    _w: number;
    _d: number;
    add(value: string): void;
    query(value: string): number;
  }
  export const CountMin: { create(n: number, e: number, p: number): DatalibCountMin };
}
