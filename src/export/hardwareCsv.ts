import type { HardwareList } from '../assembly/types.js';

const csvCell = (v: string | number | null): string => {
  const s = v === null ? '' : String(v);
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

/** The hardware list as CSV (RFC 4180 quoting, LF line ends), one header line. */
export function hardwareCsv(list: HardwareList): string {
  const head = ['item', 'standard', 'size', 'lengthMm', 'count', 'countPerBatch', 'use'];
  const rows = list.items.map((i) => [i.item, i.standard, i.size, i.lengthMm, i.count, i.countPerBatch, i.use].map(csvCell).join(','));
  return `${[head.join(','), ...rows].join('\n')}\n`;
}
