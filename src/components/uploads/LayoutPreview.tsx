import type { PreviewRow } from '~/lib/ingest/reader';
import { siteStamp } from '~/lib/site-time';

/** The first rows as read: time in the site's clock (or both readings while the order is open), and the first columns. */
export function LayoutPreview({ tagColumns, preview, timeZone }: { tagColumns: { index: number; tag: string; unit: string | null }[]; preview: PreviewRow[]; timeZone: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="grid-table">
        <thead>
          <tr>
            <th>Time as read ({timeZone})</th>
            {tagColumns.slice(0, 8).map((c) => (
              <th key={c.index} className="num">{c.tag}{c.unit ? ` [${c.unit}]` : ''}</th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.slice(0, 6).map((r) => (
            <tr key={r.line}>
              <td className="whitespace-nowrap">{r.timeIso ? siteStamp(r.timeIso, timeZone, 'yyyy-MM-dd HH:mm:ss') : (r.timeChoices ? `${r.timeChoices.dmy ?? '?'} or ${r.timeChoices.mdy ?? '?'}` : r.timeText)}</td>
              {r.cells.slice(0, 8).map((c, i: number) => (
                <td key={i} className="num">{c.value ?? <span className="text-copper">{c.rejected ?? ''}</span>}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
