/** One tag's counts in a file's report (summary.perTag of the uploads API). */
import type { TagCountRow } from '~/lib/upload-view';
import { fixed } from '~/lib/format';
import { GridTable, num } from '~/components/ui/GridTable';

export type { TagCountRow };

/** Per tag: values read and rejected; a tag that lost more than half of its values is marked. */
export function TagCounts({ rows }: { rows: TagCountRow[] }) {
  const sorted = [...rows].sort((a, b) => (b.lostShare ?? 0) - (a.lostShare ?? 0));
  return (
    <details open={sorted.some((r) => (r.lostShare ?? 0) > 0.5)}>
      <summary className="cursor-pointer text-sm">Values read and rejected per tag</summary>
      <GridTable className="mt-2" testId="tag-counts" columns={['Tag', num('Read'), num('Rejected'), 'For example']}>
        {sorted.slice(0, 200).map((r) => {
          const lost = (r.lostShare ?? 0) > 0.5;
          return (
            <tr key={r.tag} className={lost ? 'text-copper-deep' : undefined}>
              <td>{r.tag}{lost ? ' (lost more than half)' : ''}</td>
              <td className="num">{fixed(r.values, 0)}</td>
              <td className="num">{fixed(r.rejected ?? 0, 0)}</td>
              <td className="text-xs">{(r.examples ?? []).map((e) => `${e.text} (${e.count}×)`).join(', ')}</td>
            </tr>
          );
        })}
      </GridTable>
    </details>
  );
}
