/**
 * The rejected-cell CSV (uploads/{id}/rejects.csv) holds texts taken from the uploaded file as they
 * were: a cell a spreadsheet would run as a formula (starting with =, +, -, @) must come out as text.
 * Expected escaping: papaparse's escapeFormulae (a leading apostrophe, the cell quoted), as RFC 4180
 * readers and spreadsheets take it.
 */
import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { beforeAll, expect, it } from 'vitest';
import { db } from '~/server/db/client';
import { sites, uploadRejects, uploads } from '~/server/db/schema';
import { rejectsCsv } from '~/server/services/uploads';
import { describeIntegration } from '../support/integration';

const HOSTILE = ['=HYPERLINK("http://example.invalid","x")', '+1+cmd|/C calc', '-2+3', '@SUM(A1:A2)'];

describeIntegration('rejected-cell CSV', () => {
  let uploadId: string;

  beforeAll(async () => {
    const [s] = await db().insert(sites).values({ name: `Rejects CSV site ${Date.now()}`, timeZone: 'UTC' }).returning();
    const [u] = await db()
      .insert(uploads)
      .values({ siteId: s!.id, fileName: 'hostile.csv', objectKey: `test/${randomUUID()}`, source: 'api', status: 'done' })
      .returning();
    uploadId = u!.id;
    await db()
      .insert(uploadRejects)
      .values([
        ...HOSTILE.map((raw, i) => ({ uploadId, seq: i, line: 10 + i, tag: 'HG.FT-112', time: '2026-03-10T00:00:00Z', raw, reason: 'text' })),
        { uploadId, seq: HOSTILE.length, line: 20, tag: '=B1.TT-102', time: '2026-03-10T00:01:00Z', raw: 'Shutdown', reason: 'text' },
      ]);
  });

  it('escapes cells that start like a formula, in the text and in the tag, and keeps plain ones as they are', async () => {
    const csv = await rejectsCsv(uploadId);
    const rows = Papa.parse<string[]>(csv.trimEnd(), { newline: '\r\n' }).data;
    expect(rows[0]).toEqual(['line', 'tag', 'time', 'text', 'reason']);
    expect(rows.slice(1, 1 + HOSTILE.length).map((r) => r[3])).toEqual(HOSTILE.map((h) => `'${h}`));
    const last = rows[1 + HOSTILE.length]!;
    expect(last[1]).toBe("'=B1.TT-102");
    expect(last[3]).toBe('Shutdown');
    // no line of the file starts a cell with a formula character outside quotes
    for (const line of csv.split('\r\n')) for (const cell of line.split(',')) expect(cell).not.toMatch(/^[=+\-@]/);
  });
});
