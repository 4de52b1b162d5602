import AwsS3 from '@uppy/aws-s3';
import Uppy from '@uppy/core';
import { useEffect, useMemo } from 'react';
import { call } from '~/components/api';

/** Files up to this size get their SHA-256 in the browser, so a repeat is known before it is sent. */
const HASH_IN_BROWSER_BYTES = 256 * 1024 * 1024;

async function sha256Hex(file: Blob): Promise<string | undefined> {
  if (file.size > HASH_IN_BROWSER_BYTES || !globalThis.crypto?.subtle) return undefined;
  const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/** One Uppy for the page: each file asks the API for a signed PUT to the raw-file store of its site. */
function makeUppy(): Uppy {
  const u = new Uppy({ id: 'historian-files', autoProceed: false, restrictions: { maxFileSize: 4 * 1024 ** 3, allowedFileTypes: ['.csv', '.txt', '.tsv', 'text/*'] } });
  u.use(AwsS3, {
    shouldUseMultipart: false,
    async getUploadParameters(file) {
      const site = (file.meta as { siteId?: string }).siteId;
      const body = { fileName: file.name, sizeBytes: file.size, contentType: file.type || 'text/csv', sha256: await sha256Hex(file.data as Blob) };
      const data = await call<{ uploadId: string; url: string; headers: Record<string, string> }>(`/api/sites/${site}/uploads`, 'POST', body);
      u.setFileMeta(file.id, { uploadId: data.uploadId });
      return { method: 'PUT', url: data.url, headers: data.headers };
    },
  });
  return u;
}

/**
 * The page's Uppy: files go to the site chosen (also files added before the choice changed); a file
 * sent is reported complete to the API, then `onSent` runs (a refused completion goes to `onError`).
 */
export function useUppyUploads(siteId: string, onSent: () => void, onError: (text: string) => void): Uppy {
  const uppy = useMemo(makeUppy, []);

  useEffect(() => {
    const onAdded = (file: { id: string }) => uppy.setFileMeta(file.id, { siteId });
    uppy.getFiles().forEach((f) => uppy.setFileMeta(f.id, { siteId }));
    uppy.on('file-added', onAdded);
    return () => void uppy.off('file-added', onAdded);
  }, [uppy, siteId]);

  useEffect(() => {
    const onSuccess = async (file: { meta: Record<string, unknown> } | undefined) => {
      const id = file?.meta.uploadId as string | undefined;
      if (!id) return;
      await call(`/api/uploads/${id}/complete`, 'POST', {}).catch((e: Error) => onError(e.message));
      onSent();
    };
    uppy.on('upload-success', onSuccess);
    return () => void uppy.off('upload-success', onSuccess);
  }, [uppy, onSent]); // eslint-disable-line react-hooks/exhaustive-deps

  return uppy;
}
