import { useCallback, useEffect, useState } from 'react';
import { call } from '~/components/api';
import type { TagJson } from './LinkForm';

/**
 * The site's unlinked tags matching `search` (null while loading) and all its tags, read again 200 ms
 * after the search stops changing; `loadTags` reads them again now. A failed read goes to `onError`.
 */
export function useSiteTags(siteId: string, search: string, onError: (e: unknown) => void) {
  const [unlinked, setUnlinked] = useState<TagJson[] | null>(null);
  const [allTags, setAllTags] = useState<TagJson[]>([]);
  const loadTags = useCallback(async () => {
    const q = encodeURIComponent(search);
    const [u, a] = await Promise.all([call<{ tags: TagJson[] }>(`/api/sites/${siteId}/tags?unlinked=1&q=${q}`), call<{ tags: TagJson[] }>(`/api/sites/${siteId}/tags`)]);
    setUnlinked(u.tags);
    setAllTags(a.tags);
  }, [siteId, search]);
  useEffect(() => {
    const t = setTimeout(() => loadTags().catch(onError), 200);
    return () => clearTimeout(t);
  }, [loadTags]); // eslint-disable-line react-hooks/exhaustive-deps
  return { unlinked, allTags, loadTags };
}
