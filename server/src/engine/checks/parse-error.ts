import { defineCheck } from './defineCheck';

/** Problems found while reading a file. Readers report them; the rest of the file is still read. */
export default defineCheck({
  id: 'parse-error',
  description: 'The file cannot be read here: malformed XML, path data, DXF groups or attribute values. What came before the error is still analysed.',
  defaultSeverity: 'error',
  messages: {
    xml: 'Malformed XML: {detail}.',
    pathData: 'Malformed path data: {detail}. The path is drawn only up to this point.',
    value: 'Invalid {attribute} value: {detail}.',
    dxf: 'Malformed DXF: {detail}.',
    unsupported: 'Not analysed: {detail}.',
  },
});
