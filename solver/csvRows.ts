import { ModelError } from './model';

/** One record of a CSV text: its cells and the line it starts on (1-based). */
export interface CsvRecord {
  readonly cells: string[];
  readonly line: number;
}

/**
 * The records of a CSV text as RFC 4180 section 2 defines them: fields separated by commas,
 * records by CRLF or LF (a lone CR too), a field enclosed in double quotes may hold commas, line
 * breaks and doubled quotes. A leading UTF-8 byte order mark is dropped and blank lines are
 * skipped (a spreadsheet's last line often is one). Throws ModelError on a quote that is never
 * closed or text after a closing quote, naming the line.
 */
export function readCsvRecords(text: string): CsvRecord[] {
  const source = text.startsWith('\ufeff') ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  let cells: string[] = [];
  let cell = '';
  let line = 1;
  let recordLine = 1;
  let k = 0;
  let quotedCell = false;
  const endRecord = () => {
    cells.push(cell);
    if (!(cells.length === 1 && cells[0] === '' && !quotedCell)) {
      records.push({ cells, line: recordLine });
    }
    cells = [];
    cell = '';
    quotedCell = false;
  };
  while (k < source.length) {
    const c = source[k]!;
    if (c === '"' && cell === '' && !quotedCell) {
      // A quoted field: up to the closing quote, with "" standing for one quote.
      const opened = line;
      quotedCell = true;
      k++;
      for (;;) {
        if (k >= source.length) {
          throw new ModelError(`line ${opened}: a quoted field is never closed (a " is missing)`);
        }
        const q = source[k]!;
        if (q === '"') {
          if (source[k + 1] === '"') {
            cell += '"';
            k += 2;
            continue;
          }
          k++;
          break;
        }
        if (q === '\n' || (q === '\r' && source[k + 1] !== '\n')) line++;
        cell += q;
        k++;
      }
      const next = source[k];
      if (next !== undefined && next !== ',' && next !== '\n' && next !== '\r') {
        throw new ModelError(`line ${line}: text after a closing quote (write "" for a quote)`);
      }
      continue;
    }
    if (c === ',') {
      cells.push(cell);
      cell = '';
      quotedCell = false;
      k++;
      continue;
    }
    if (c === '\r' || c === '\n') {
      endRecord();
      k += c === '\r' && source[k + 1] === '\n' ? 2 : 1;
      line++;
      recordLine = line;
      continue;
    }
    cell += c;
    k++;
  }
  if (cell !== '' || cells.length > 0 || quotedCell) endRecord();
  return records;
}
