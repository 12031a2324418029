import { useState } from 'react';
import { toast } from '@/lib/toast';
import { imageUrl, markdownImages } from '@shared/markdown/images';
import { Button } from '@/components/ui/button';
import { useSetImageHidden } from '../api/reviews';

type Img = { id: string; alt: string };

/** Our images in a body, once each, in order. */
function imagesOf(body: string): Img[] {
  const seen = new Map<string, Img>();
  for (const m of markdownImages(body)) if (m.ref && !seen.has(m.ref.id)) seen.set(m.ref.id, { id: m.ref.id, alt: m.alt });
  return [...seen.values()];
}

/** Images the proposal adds and removes against the live version, as thumbnails; a moderator can hide one. */
export function ImageChanges({ before, after }: { before: string; after: string }) {
  const was = imagesOf(before);
  const now = imagesOf(after);
  const added = now.filter((i) => !was.some((w) => w.id === i.id));
  const removed = was.filter((i) => !now.some((n) => n.id === i.id));
  if (!added.length && !removed.length) return <p className="text-sm text-ink-soft">No images added or removed.</p>;
  return (
    <div className="flex flex-col gap-4">
      {added.length > 0 && <Thumbs label="Added" images={added} tone="border-ok-line bg-ok-wash" />}
      {removed.length > 0 && <Thumbs label="Removed" images={removed} tone="border-danger-line bg-danger-wash" />}
    </div>
  );
}

function Thumbs({ label, images, tone }: { label: string; images: Img[]; tone: string }) {
  return (
    <div>
      <h3 className="mb-2 text-sm font-semibold">
        {label} ({images.length})
      </h3>
      <ul className="grid grid-cols-[repeat(auto-fill,minmax(10rem,1fr))] gap-3">
        {images.map((img) => (
          <li key={img.id} className={`flex flex-col gap-1 rounded-md border p-2 ${tone}`}>
            <img src={imageUrl(img.id, 480)} alt={img.alt} loading="lazy" className="aspect-[4/3] w-full rounded object-cover" width={160} height={120} />
            <span className="text-xs text-ink-soft">{img.alt || <em>no alt text</em>}</span>
            <HideImage id={img.id} />
          </li>
        ))}
      </ul>
    </div>
  );
}

function HideImage({ id }: { id: string }) {
  const setHidden = useSetImageHidden();
  const [hidden, setHiddenState] = useState(false);
  const toggle = async () => {
    try {
      const reason = hidden ? undefined : (window.prompt('Why hide this image? (kept in the audit log)') ?? '').trim();
      if (!hidden && (!reason || reason.length < 3)) return;
      await setHidden.mutateAsync({ id, hide: !hidden, reason });
      setHiddenState(!hidden);
      toast.success(hidden ? 'Image shown again' : 'Image hidden: pages show a notice in its place');
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <Button size="sm" variant="ghost" onClick={() => void toggle()} pending={setHidden.isPending}>
      {hidden ? 'Show image again' : 'Hide image'}
    </Button>
  );
}
