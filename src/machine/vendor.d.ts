// Types for the general-purpose G-code reader used by the read-back check (it ships none).
declare module 'gcode-toolpath' {
  interface Vec3 { x: number; y: number; z: number }
  interface Modal { motion: string; units: string; plane: string; distance: string }
  interface ToolpathOptions {
    addLine?: (modal: Modal, v1: Vec3, v2: Vec3) => void;
    addArcCurve?: (modal: Modal, v1: Vec3, v2: Vec3, v0: Vec3) => void;
  }
  interface ParsedLine { line: string; words: [string, number | string][]; comments?: string[] }
  export default class Toolpath {
    constructor(options?: ToolpathOptions);
    loadFromStringSync(text: string, callback?: (data: ParsedLine, index: number) => void): ParsedLine[];
  }
}

