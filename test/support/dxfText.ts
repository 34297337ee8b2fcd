/** An ASCII DXF text in millimetres ($INSUNITS 4) whose ENTITIES section holds the given group pairs. */
export const dxf = (...entities: (string | number)[][]): string =>
  ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', '4', '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', ...entities.flat(), '0', 'ENDSEC', '0', 'EOF'].join('\n') + '\n';

/** The group pairs of a LINE on layer CUT. */
export const line = (x0: number, y0: number, x1: number, y1: number): (string | number)[] =>
  ['0', 'LINE', '8', 'CUT', '10', x0, '20', y0, '11', x1, '21', y1];
