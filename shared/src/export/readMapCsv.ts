/** A CSV export read back: the `#` header lines (without "# "), the column names and the rows as text cells. */
export interface MapCsvTable {
  comments: string[];
  columns: string[];
  rows: string[][];
}

/**
 * Reads text written by `mapCsvChunks` (comma-separated, no quoting, `#` comment lines first). For
 * checks and tests; a spreadsheet or any CSV reader that skips `#` lines reads the same file.
 *
 * @example
 * readMapCsv('# engine version: 0.1.0\na,b\n1,2\n') // { comments: ['engine version: 0.1.0'], columns: ['a', 'b'], rows: [['1', '2']] }
 */
export function readMapCsv(text: string): MapCsvTable {
  const comments: string[] = [];
  let columns: string[] | null = null;
  const rows: string[][] = [];
  for (const line of text.split('\n')) {
    if (line === '') continue;
    if (columns === null && line.startsWith('#')) comments.push(line.replace(/^# ?/, ''));
    else if (columns === null) columns = line.split(',');
    else rows.push(line.split(','));
  }
  return { comments, columns: columns ?? [], rows };
}
