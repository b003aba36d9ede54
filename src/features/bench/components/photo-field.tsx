import { useId, useState } from 'react';
import type { LocalPhoto } from '../../../lib/offline/db';

const MAX_BYTES = 8 * 1024 * 1024;

/** Photos from the camera or files; thumbnails show at once, the upload waits in the outbox. */
export function PhotoField({ photos, onAdd }: { photos: LocalPhoto[]; onAdd(file: File): Promise<void> }) {
  const id = useId();
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <div className="space-y-2">
      <label htmlFor={id} className="flex min-h-14 cursor-pointer items-center justify-center rounded-xl border-2 border-dashed border-ink/60 bg-panel px-4 text-lg font-bold">
        Add a photo
      </label>
      <input id={id} type="file" accept="image/jpeg,image/png,image/webp" capture="environment" className="sr-only"
        onChange={async (e) => {
          const file = e.target.files?.[0];
          e.target.value = '';
          if (!file) return;
          if (file.size > MAX_BYTES) return setProblem('That photo is larger than 8 MB. Take it again at a lower resolution.');
          setProblem(null);
          await onAdd(file);
        }} />
      {problem && <p role="alert" className="text-stop">{problem}</p>}
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos of this step">
          {photos.map((p) => (
            <li key={p.id}>{p.thumbUrl ? <img src={p.thumbUrl} alt={`Photo ${p.name}`} className="h-20 w-20 rounded-lg border border-line object-cover" /> : <span className="text-sm">{p.name}</span>}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
