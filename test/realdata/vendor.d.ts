/** Just the parts of the untyped dev dependencies that the real-data corpus uses. */
declare module 'opentype.js' {
  export interface Path {
    toPathData(decimals?: number): string;
  }
  export interface Font {
    getPaths(text: string, x: number, y: number, fontSize: number): Path[];
  }
  const opentype: { parse(buffer: ArrayBuffer): Font };
  export default opentype;
}

declare module 'topojson-client' {
  export function feature(topology: unknown, object: unknown): {
    features: { properties: { name?: string }; geometry: { type: string; coordinates: unknown } | null }[];
  };
}
