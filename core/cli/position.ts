// Offsets to the 1-based lines and columns people and SARIF read.
import { lineOf } from '../scan/lines';

export function position(starts: number[], offset: number): { line: number; column: number } {
  const line = lineOf(starts, offset);
  return { line: line + 1, column: offset - starts[line] + 1 };
}
