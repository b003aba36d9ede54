import { useEffect, useRef, useState, type DragEvent } from 'react';
import { MAX_PICTURES_PER_STEP, type Step, type StepPicture } from '@shared/schema';
import { api } from '../../../../lib/api-client';
import { pictureProblem, pictureUrl } from '../../../../lib/pictures/picture-url';
import { Button } from '../../../../components/ui/button';
import { Input } from '../../../../components/ui/field';
import { Alert } from '../../../../components/ui/card';
import { cx } from '../../../../components/ui/cx';
import type { VersionIds } from '../../api/versions';

interface Pending { key: string; file: File; preview: string; caption: string; busy: boolean; error: string | null }

/** One stored picture of the step: thumbnail, caption (required, it is the alt text), order and removal. */
function PictureRow({ picture, index, count, onCaption, onMove, onRemove }: {
  picture: StepPicture; index: number; count: number; onCaption: (c: string) => void; onMove: (by: -1 | 1) => void; onRemove: () => void;
}) {
  const [caption, setCaption] = useState(picture.caption);
  useEffect(() => setCaption(picture.caption), [picture.caption]);
  const empty = caption.trim() === '';
  return (
    <li className="flex gap-2 rounded-lg border border-line p-2" data-testid="step-picture">
      <img src={pictureUrl(picture.id, 'thumb')} alt={picture.caption} loading="lazy" className="h-16 w-16 shrink-0 rounded object-cover" />
      <div className="flex min-w-0 flex-1 flex-col gap-1">
        <Input aria-label={`Caption of picture ${index + 1}`} value={caption} maxLength={200} aria-invalid={empty || undefined}
          onChange={(e) => { setCaption(e.target.value); if (e.target.value.trim()) onCaption(e.target.value); }} />
        {empty && <p role="alert" className="text-sm font-semibold text-stop">Say what the picture shows.</p>}
        <div className="flex gap-1">
          <Button variant="ghost" aria-label={`Move picture ${index + 1} up`} disabled={index === 0} onClick={() => onMove(-1)}>↑</Button>
          <Button variant="ghost" aria-label={`Move picture ${index + 1} down`} disabled={index === count - 1} onClick={() => onMove(1)}>↓</Button>
          <Button variant="ghost" className="ml-auto text-stop" aria-label={`Remove picture ${index + 1}`} onClick={onRemove}>Remove</Button>
        </div>
      </div>
    </li>
  );
}

/** A picked file waiting for its caption before it is uploaded. */
function PendingRow({ p, onCaption, onAttach, onDrop }: { p: Pending; onCaption: (c: string) => void; onAttach: () => void; onDrop: () => void }) {
  return (
    <li className="flex flex-col gap-1 rounded-lg border-2 border-dashed border-signal p-2">
      <div className="flex gap-2">
        <img src={p.preview} alt="" className="h-16 w-16 shrink-0 rounded object-cover" />
        <Input aria-label={`Caption for ${p.file.name}`} placeholder="What it shows, e.g. pulser connector, pin 2 green/white" value={p.caption} maxLength={200} onChange={(e) => onCaption(e.target.value)} />
      </div>
      <div className="flex gap-1">
        <Button variant="secondary" busy={p.busy} disabled={!p.caption.trim()} onClick={onAttach}>Attach</Button>
        <Button variant="ghost" onClick={onDrop}>Cancel</Button>
      </div>
      {p.error && <Alert>{p.error}</Alert>}
    </li>
  );
}

/**
 * Reference pictures of a step: drop files or pick them, caption each (required), then Attach
 * uploads it (the server checks and renders it) and adds it to the step as an undoable edit.
 */
export function PicturesEditor({ ids, step, readOnly, onChange }: { ids: VersionIds; step: Step; readOnly: boolean; onChange: (s: Step) => void }) {
  const pictures = step.pictures ?? [];
  const latest = useRef(step);
  latest.current = step;
  const [pending, setPending] = useState<Pending[]>([]);
  const [problem, setProblem] = useState<string | null>(null);
  const [over, setOver] = useState(false);
  const set = (next: StepPicture[]) => onChange({ ...latest.current, pictures: next });
  const patch = (key: string, p: Partial<Pending>) => setPending((list) => list.map((x) => (x.key === key ? { ...x, ...p } : x)));
  const drop = (key: string) => setPending((list) => list.filter((x) => { if (x.key === key) URL.revokeObjectURL(x.preview); return x.key !== key; }));

  const add = (files: FileList | File[]) => {
    setProblem(null);
    const room = MAX_PICTURES_PER_STEP - pictures.length - pending.length;
    const list = [...files];
    const bad = list.map(pictureProblem).find(Boolean);
    if (bad) setProblem(bad);
    const good = list.filter((f) => !pictureProblem(f)).slice(0, Math.max(0, room));
    if (list.length > good.length && !bad) setProblem(`A step holds at most ${MAX_PICTURES_PER_STEP} pictures.`);
    setPending((old) => [...old, ...good.map((file) => ({ key: crypto.randomUUID(), file, preview: URL.createObjectURL(file), caption: '', busy: false, error: null }))]);
  };
  const attach = async (p: Pending) => {
    patch(p.key, { busy: true, error: null });
    try {
      const form = new FormData();
      form.append('stepId', latest.current.id);
      form.append('picture', p.file, p.file.name);
      const stored = await api.upload<{ id: string }>(`/api/procedures/${ids.procedureId}/versions/${ids.versionId}/pictures`, form);
      set([...(latest.current.pictures ?? []), { id: stored.id, caption: p.caption.trim() }]);
      drop(p.key);
    } catch (e) {
      patch(p.key, { busy: false, error: e instanceof Error ? e.message : 'The picture could not be uploaded. Try again.' });
    }
  };
  const move = (i: number, by: -1 | 1) => {
    const next = [...pictures];
    [next[i], next[i + by]] = [next[i + by]!, next[i]!];
    set(next);
  };
  const onDrop = (e: DragEvent) => { e.preventDefault(); setOver(false); if (!readOnly) add(e.dataTransfer.files); };

  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-2" data-testid="pictures-editor">
      <legend className="font-semibold">Reference pictures</legend>
      {pictures.length === 0 && readOnly && <p className="text-sm text-ink-soft">No pictures on this step.</p>}
      <ul className="flex flex-col gap-2">
        {pictures.map((p, i) => (
          <PictureRow key={p.id} picture={p} index={i} count={pictures.length}
            onCaption={(caption) => set(pictures.map((x, j) => (j === i ? { ...x, caption: caption.trim() } : x)))}
            onMove={(by) => move(i, by)} onRemove={() => set(pictures.filter((_, j) => j !== i))} />
        ))}
        {pending.map((p) => <PendingRow key={p.key} p={p} onCaption={(caption) => patch(p.key, { caption })} onAttach={() => void attach(p)} onDrop={() => drop(p.key)} />)}
      </ul>
      {!readOnly && pictures.length + pending.length < MAX_PICTURES_PER_STEP && (
        <label onDragOver={(e) => { e.preventDefault(); setOver(true); }} onDragLeave={() => setOver(false)} onDrop={onDrop}
          className={cx('flex min-h-20 cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed px-3 py-2 text-center text-sm', over ? 'border-signal bg-signal-soft' : 'border-line')}>
          <span className="font-semibold">Drop pictures here, or choose files</span>
          <span className="text-ink-soft">JPEG, PNG or WebP up to 8 MB: a photo, a wiring sketch, a connector's pins</span>
          <input type="file" accept="image/jpeg,image/png,image/webp" multiple className="sr-only" aria-label="Add pictures to this step"
            onChange={(e) => { if (e.target.files) add(e.target.files); e.target.value = ''; }} />
        </label>
      )}
      {problem && <Alert>{problem}</Alert>}
    </fieldset>
  );
}
