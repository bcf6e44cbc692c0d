import { listRows, MAX_LISTED_ROWS, type LoadtestIssue } from './issues';

export interface TimeOrdered {
  readonly time: Float64Array;
  readonly columns: Float64Array[];
  readonly lines: Int32Array;
  readonly warnings: LoadtestIssue[];
}

/**
 * Put samples in time order and drop repeated time stamps. A logger that buffers can write a few
 * samples late; sorting restores the run. Two samples at one instant cannot both be right, so the
 * first one in the file is kept. Both are reported with their lines, so nothing changes silently.
 */
export function orderByTime(time: Float64Array, columns: Float64Array[], lines: Int32Array): TimeOrdered {
  const n = time.length;
  let ordered = true;
  for (let i = 1; i < n; i++) {
    if (!((time[i] as number) > (time[i - 1] as number))) {
      ordered = false;
      break;
    }
  }
  if (ordered) return { time, columns, lines, warnings: [] };

  const late: number[] = [];
  let runningMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = time[i] as number;
    if (t < runningMax) late.push(lines[i] as number);
    else runningMax = t;
  }

  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => (time[a] as number) - (time[b] as number) || a - b);

  const keep: number[] = [];
  const repeated: number[] = [];
  for (let k = 0; k < n; k++) {
    const i = order[k] as number;
    const prev = keep.length ? (keep[keep.length - 1] as number) : -1;
    if (prev !== -1 && time[i] === time[prev]) repeated.push(lines[i] as number);
    else keep.push(i);
  }

  const pick = (src: Float64Array) => Float64Array.from(keep, (i) => src[i] as number);
  const warnings: LoadtestIssue[] = [];
  if (late.length) {
    warnings.push({
      code: 'time-out-of-order',
      rows: late.slice(0, MAX_LISTED_ROWS),
      rowCount: late.length,
      row: late[0],
      message: `${late.length} sample${late.length === 1 ? ' was' : 's were'} recorded out of time order (line${late.length === 1 ? '' : 's'} ${listRows(late)}); ${late.length === 1 ? 'it was' : 'they were'} put back in time order.`,
    });
  }
  if (repeated.length) {
    repeated.sort((a, b) => a - b);
    warnings.push({
      code: 'time-repeated',
      rows: repeated.slice(0, MAX_LISTED_ROWS),
      rowCount: repeated.length,
      row: repeated[0],
      message: `${repeated.length} sample${repeated.length === 1 ? ' repeats' : 's repeat'} an earlier time stamp (line${repeated.length === 1 ? '' : 's'} ${listRows(repeated)}); the first sample at each time was kept and the repeats were dropped.`,
    });
  }
  return { time: pick(time), columns: columns.map(pick), lines: Int32Array.from(keep, (i) => lines[i] as number), warnings };
}
