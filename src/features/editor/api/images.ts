import { useMutation } from '@tanstack/react-query';
import type { UploadedImage } from '@shared/schemas/image';
import { api, type Envelope } from '@/lib/api-client';

/** Uploads one image into the author's draft; `onProgress` gets the sent fraction (0–1). */
export function useUploadImage() {
  return useMutation({
    mutationFn: async ({ revisionId, file, onProgress }: { revisionId: string; file: File; onProgress?: (f: number) => void }) => {
      const form = new FormData();
      form.append('file', file);
      return (await api.upload<Envelope<UploadedImage>>(`/api/revisions/${revisionId}/images`, form, onProgress)).data;
    },
  });
}
