import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../../components/ui/button';
import { Textarea } from '../../../../components/ui/field';
import { Alert } from '../../../../components/ui/card';
import { draftingKeys, draftingQueries } from '../../api/queries';
import { addComment, type VersionIds } from '../../api/versions';
import type { DocumentDiff } from '../../lib/diff';
import { useFormat } from '../../../../lib/format';

function PictureChange({ stepId, caption, added, onPick }: { stepId: string; caption: string; added: boolean; onPick: (id: string) => void }) {
  return (
    <li data-testid="picture-change"><button type="button" className="w-full rounded px-1 text-left hover:bg-ink/5" onClick={() => onPick(stepId)}>
      <span className={`mr-1 font-bold ${added ? 'text-go' : 'text-stop'}`}>{added ? 'picture added' : 'picture removed'}</span><code>{stepId}</code> “{caption}”</button></li>
  );
}

function DiffList({ diff, baseNumber, onPick, onShowRemoved }: { diff: DocumentDiff; baseNumber: number; onPick: (id: string) => void; onShowRemoved: (id: string) => void }) {
  const empty = diff.added.length + diff.removed.length + diff.changed.length + diff.meta.length === 0;
  const item = (id: string, text: string, tone: string, go = onPick, title?: string) => (
    <li key={`${tone}-${id}`}><button type="button" className="w-full rounded px-1 text-left hover:bg-ink/5" onClick={() => go(id)}>
      <span className={`mr-1 font-bold ${tone}`}>{text}</span><code>{id}</code>{title && ` ${title}`}</button></li>
  );
  return (
    <div data-testid="diff-list">
      <h3 className="font-semibold">Changes since version {baseNumber}</h3>
      {empty && <p className="text-sm text-ink-soft">No changes.</p>}
      <ul className="text-sm">
        {diff.added.map((s) => item(s.id, 'added', 'text-go'))}
        {diff.removed.map((s) => item(s.id, 'removed', 'text-stop', onShowRemoved, s.title))}
        {diff.changed.map((s) => item(s.id, `changed (${s.fields.join(', ')})`, 'text-signal'))}
        {diff.changed.flatMap((s) => [
          ...s.picturesAdded.map((caption, i) => <PictureChange key={`pa-${s.id}-${i}`} stepId={s.id} caption={caption} added onPick={onPick} />),
          ...s.picturesRemoved.map((caption, i) => <PictureChange key={`pr-${s.id}-${i}`} stepId={s.id} caption={caption} added={false} onPick={onPick} />),
        ])}
        {diff.meta.length > 0 && <li className="px-1"><span className="mr-1 font-bold text-signal">procedure</span>{diff.meta.join(', ')}</li>}
      </ul>
    </div>
  );
}

/** Review: what changed against the last published version, and the comments on this version. */
export function ReviewPanel({ ids, diff, baseNumber, selectedStep, canComment, onPick, onShowRemoved }: {
  ids: VersionIds; diff: DocumentDiff | null; baseNumber: number | null; selectedStep: string | null; canComment: boolean; onPick: (id: string) => void;
  /** Brings a removed step into view on the canvas (it cannot be selected: it is not in the draft). */
  onShowRemoved: (id: string) => void;
}) {
  const qc = useQueryClient();
  const comments = useQuery({ ...draftingQueries.comments(ids.procedureId, ids.versionId), enabled: canComment });
  const [body, setBody] = useState('');
  const fmt = useFormat();
  const post = useMutation({
    mutationFn: () => addComment(ids, body, selectedStep ?? undefined),
    onSuccess: () => { setBody(''); void qc.invalidateQueries({ queryKey: draftingKeys.comments(ids.procedureId, ids.versionId) }); },
  });
  return (
    <section aria-labelledby="review-title" className="flex flex-col gap-3">
      <h2 id="review-title" className="text-sm font-bold uppercase tracking-wide text-ink-soft">Review</h2>
      {diff && baseNumber !== null ? <DiffList diff={diff} baseNumber={baseNumber} onPick={onPick} onShowRemoved={onShowRemoved} /> : <p className="text-sm text-ink-soft">Not published before: every step is new.</p>}
      {canComment && (
        <>
          <ul className="flex flex-col gap-2" data-testid="comments">
            {comments.data?.map((c) => (
              <li key={c.id} className="rounded-lg bg-paper p-2 text-sm">
                <p className="text-xs text-ink-soft">{c.author ?? 'Someone'} · {fmt.dateTime(c.createdAt)}{c.stepId && <> · on <button type="button" className="underline" onClick={() => onPick(c.stepId!)}>{c.stepId}</button></>}</p>
                <p className="whitespace-pre-line">{c.body}</p>
              </li>
            ))}
          </ul>
          <form className="flex flex-col gap-2" onSubmit={(e) => { e.preventDefault(); if (body.trim()) post.mutate(); }}>
            <Textarea aria-label="Comment" value={body} rows={2} placeholder={selectedStep ? `Comment on ${selectedStep}` : 'Comment on the procedure'} onChange={(e) => setBody(e.target.value)} />
            <Button type="submit" variant="secondary" busy={post.isPending} disabled={!body.trim()}>Add comment</Button>
            {post.error && <Alert>{post.error.message}</Alert>}
          </form>
        </>
      )}
    </section>
  );
}
