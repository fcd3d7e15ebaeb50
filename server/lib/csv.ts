import type { Response } from 'express';
import { stringify } from 'csv-stringify/sync';

/** Sends rows as a CSV download (RFC 4180 quoting by csv-stringify). */
export function sendCsv(res: Response, fileName: string, columns: { key: string; header: string }[], rows: Record<string, unknown>[]) {
  const text = stringify(
    rows.map((r) => columns.map((c) => {
      const v = r[c.key];
      if (v instanceof Date) return v.toISOString();
      // A cell that starts with = + - @ would run as a formula in a spreadsheet; quote it as text.
      return typeof v === 'string' && /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
    })),
    { header: true, columns: columns.map((c) => c.header) },
  );
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${fileName.replace(/[^A-Za-z0-9._-]/g, '_')}"`);
  res.end(text);
}
