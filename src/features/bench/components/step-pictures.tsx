import { lazy, Suspense, useEffect, useState } from 'react';
import type { StepPicture } from '@shared/schema/procedure';
import { getLocalPicture } from '../../../lib/offline/pictures';
import { pictureUrl } from '../../../lib/pictures/picture-url';

// The zoom view is fetched only when a technician first taps a picture: not in the Bench route's bundle.
const PictureZoom = lazy(() => import('./picture-zoom'));

/**
 * The picture's source: the copy kept on the phone (works without signal), else the server's
 * phone rendition. Read after the first paint, so the step itself is never held up.
 */
function usePictureSrc(id: string): string | null {
  const [src, setSrc] = useState<string | null>(null);
  useEffect(() => {
    let url: string | null = null;
    let live = true;
    void getLocalPicture(id).catch(() => undefined).then((kept) => {
      if (!live) return;
      if (kept) { url = URL.createObjectURL(kept.blob); setSrc(url); } else setSrc(pictureUrl(id, 'phone'));
    });
    return () => { live = false; if (url) URL.revokeObjectURL(url); };
  }, [id]);
  return src;
}

function PictureTile({ picture, alone, onOpen }: { picture: StepPicture; alone: boolean; onOpen: (src: string) => void }) {
  const src = usePictureSrc(picture.id);
  // one picture takes the width of the phone; several sit in a row to swipe, the next one peeking in
  return (
    <figure className={alone ? 'w-full' : 'w-[72%] max-w-72 shrink-0 snap-start'} data-testid="bench-picture">
      <button type="button" className="block aspect-[4/3] w-full overflow-hidden rounded-lg border-2 border-ink/30 bg-panel" aria-label={`Zoom: ${picture.caption}`} disabled={!src} onClick={() => src && onOpen(src)}>
        {src && <img src={src} alt={picture.caption} loading="lazy" decoding="async" className="h-full w-full object-contain" />}
      </button>
      <figcaption className="mt-1 text-lg leading-snug">{picture.caption}</figcaption>
    </figure>
  );
}

/** The step's reference pictures in a row to swipe; a tap opens one full screen to zoom. */
export function StepPictures({ pictures }: { pictures: readonly StepPicture[] | undefined }) {
  const [open, setOpen] = useState<{ src: string; caption: string } | null>(null);
  if (!pictures?.length) return null;
  return (
    <section aria-label="Reference pictures">
      <div className="flex snap-x gap-3 overflow-x-auto pb-1">
        {pictures.map((p) => <PictureTile key={p.id} picture={p} alone={pictures.length === 1} onOpen={(src) => setOpen({ src, caption: p.caption })} />)}
      </div>
      {open && <Suspense fallback={null}><PictureZoom src={open.src} caption={open.caption} onClose={() => setOpen(null)} /></Suspense>}
    </section>
  );
}
