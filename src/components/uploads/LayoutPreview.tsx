import type { PreviewRow } from '~/lib/ingest/reader';
import { siteStamp } from '~/lib/site-time';
import { GridTable, num } from '~/components/ui/GridTable';

/** The first rows as read: time in the site's clock (or both readings while the order is open), and the first columns. */
export function LayoutPreview({ tagColumns, preview, timeZone }: { tagColumns: { index: number; tag: string; unit: string | null }[]; preview: PreviewRow[]; timeZone: string }) {
  return (
    <div className="overflow-x-auto">
      <GridTable columns={[<>Time as read ({timeZone})</>, ...tagColumns.slice(0, 8).map((c) => num(<>{c.tag}{c.unit ? ` [${c.unit}]` : ''}</>))]}>
          {preview.slice(0, 6).map((r) => (
            <tr key={r.line}>
              <td className="whitespace-nowrap">{r.timeIso ? siteStamp(r.timeIso, timeZone, 'yyyy-MM-dd HH:mm:ss') : (r.timeChoices ? `${r.timeChoices.dmy ?? '?'} or ${r.timeChoices.mdy ?? '?'}` : r.timeText)}</td>
              {r.cells.slice(0, 8).map((c, i: number) => (
                <td key={i} className="num">{c.value ?? <span className="text-copper">{c.rejected ?? ''}</span>}</td>
              ))}
            </tr>
          ))}
      </GridTable>
    </div>
  );
}
