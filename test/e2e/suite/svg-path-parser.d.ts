/** The parts of svg-path-parser (an independent SVG path-data parser) the suite uses. */
declare module 'svg-path-parser' {
  export interface Command {
    readonly code: string;
    readonly command: string;
    readonly x?: number;
    readonly y?: number;
  }
  export function parseSVG(d: string): Command[];
  export function makeAbsolute(commands: Command[]): Command[];
}
