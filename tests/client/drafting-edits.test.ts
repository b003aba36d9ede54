import { describe, it, expect } from 'vitest';
import { lintProcedure } from '@shared/engine';
import { doc, ohmsReading, observation, finding, task } from '../shared/fixtures';
import { applyEdit, historyReducer, initialHistory, UNCONNECTED } from '../../src/features/drafting/lib/edits';
import { toFlow, fromFlow, keepUnchanged, openingView } from '../../src/features/drafting/lib/flow';
import { stepBox } from '@shared/engine/geometry';
import { copySteps, pasteSteps } from '../../src/features/drafting/lib/clipboard';
import { diffDocuments } from '../../src/features/drafting/lib/diff';
import { stepFor } from '../../src/features/drafting/lib/new-step';

const coilCheck = () => doc([
  ohmsReading('coilPrimary', 0.2, 1.0, { low: 'shorted', ok: 'sparkSeen', high: 'openCoil' }),
  observation('sparkSeen', { yes: 'openCoil', no: 'shorted' }),
  finding('shorted'),
  finding('openCoil'),
]);

describe('editing as data', () => {
  it('undo brings back the document before an edit and redo applies it again', () => {
    const start = coilCheck();
    let h = initialHistory(start);
    const added = stepFor(start, 'task', { x: 10, y: 20 });
    h = historyReducer(h, { type: 'edit', edit: { type: 'add-steps', steps: [added] } });
    h = historyReducer(h, { type: 'edit', edit: { type: 'connect', from: 'sparkSeen', handle: 'answer:no', to: added.id } });
    expect(h.present.steps).toHaveLength(5);
    h = historyReducer(historyReducer(h, { type: 'undo' }), { type: 'undo' });
    expect(h.present).toEqual(start);
    h = historyReducer(h, { type: 'redo' });
    expect(h.present.steps.map((s) => s.id)).toContain(added.id);
    expect(h.future).toHaveLength(1);
  });

  it('a new edit after undo drops the redo list', () => {
    let h = initialHistory(coilCheck());
    h = historyReducer(h, { type: 'edit', edit: { type: 'set-start', id: 'sparkSeen' } });
    h = historyReducer(h, { type: 'undo' });
    h = historyReducer(h, { type: 'edit', edit: { type: 'move-steps', moves: [{ id: 'shorted', position: { x: 5, y: 5 } }] } });
    expect(h.future).toEqual([]);
  });

  it('connecting from a band handle points that band at the step, and the edge carries the band label', () => {
    const d = applyEdit(coilCheck(), { type: 'connect', from: 'coilPrimary', handle: 'band:high', to: 'shorted' });
    const reading = d.steps[0]!;
    expect(reading.kind === 'reading' && reading.bands[2]!.next).toBe('shorted');
    const { edges } = toFlow(d);
    expect(edges).toContainEqual(expect.objectContaining({ source: 'coilPrimary', sourceHandle: 'band:high', target: 'shorted', label: 'Above' }));
  });

  it('removing a step leaves the branches that pointed at it open, and the soundness check names them', () => {
    const d = applyEdit(coilCheck(), { type: 'remove-steps', ids: ['openCoil'] });
    const obs = d.steps.find((s) => s.id === 'sparkSeen')!;
    expect(obs.kind === 'observation' && obs.answers[0]!.next).toBe(UNCONNECTED);
    const dangling = lintProcedure(d).findings.filter((f) => f.code === 'dangling-branch');
    expect(dangling.map((f) => f.steps[0]).sort()).toEqual(['coilPrimary', 'sparkSeen']);
  });

  it('renaming a step id follows every branch and the start to the new id', () => {
    const d0 = coilCheck();
    const reading = d0.steps[0]!;
    const d = applyEdit(d0, { type: 'update-step', id: 'coilPrimary', step: { ...reading, id: 'primaryOhms' } });
    expect(d.start).toBe('primaryOhms');
    const shorted = applyEdit(d, { type: 'update-step', id: 'shorted', step: { ...d.steps[2]!, id: 'primaryShorted' } });
    const r = shorted.steps[0]!;
    expect(r.kind === 'reading' && r.bands[0]!.next).toBe('primaryShorted');
    expect(lintProcedure(shorted).errorCount).toBe(0);
  });

  it('removing the start step moves the start to the first remaining step', () => {
    const d = applyEdit(doc([task('a', 'b'), finding('b')]), { type: 'remove-steps', ids: ['a'] });
    expect(d.start).toBe('b');
  });
});

describe('toFlow and fromFlow', () => {
  it('a document survives the trip to React Flow and back, positions included', () => {
    const d = applyEdit(coilCheck(), { type: 'move-steps', moves: [{ id: 'shorted', position: { x: 120, y: 340 } }] });
    const { nodes, edges } = toFlow(d);
    expect(fromFlow(d, nodes, edges)).toEqual(d);
  });

  it('node data is plain data: it survives JSON unchanged, with no functions in it', () => {
    const { nodes } = toFlow(coilCheck(), { issues: new Map([['shorted', 'warning']]), path: new Set(['coilPrimary']) });
    expect(JSON.parse(JSON.stringify(nodes))).toEqual(nodes);
  });

  it('after an edit to one step, only that step and its branches get new objects, so React Flow redraws only them', () => {
    const d = coilCheck();
    const before = toFlow(d);
    const edited = applyEdit(d, { type: 'connect', from: 'sparkSeen', handle: 'answer:yes', to: 'shorted' });
    const after = keepUnchanged(before, toFlow(edited));
    const renewedNodes = after.nodes.filter((n, i) => n !== before.nodes[i]).map((n) => n.id);
    const renewedEdges = after.edges.filter((e) => !before.edges.includes(e)).map((e) => e.id);
    expect(renewedNodes).toEqual(['sparkSeen']);
    expect(renewedEdges).toEqual(['sparkSeen:answer:yes']);
    expect(fromFlow(edited, after.nodes, after.edges)).toEqual(edited);
  });

  it('every node carries its box and handle places, so a step never rendered (off screen) can still be fitted and joined', () => {
    const { nodes } = toFlow(coilCheck());
    for (const n of nodes) {
      expect(n.measured).toEqual(stepBox(n.data.step));
      expect(n.handles!.map((h) => h.id).sort()).toEqual([...n.data.handles.map((h) => h.id), 'in'].sort());
      for (const h of n.handles!) expect(h.x).toBeGreaterThanOrEqual(0);
    }
  });

  it('a handle whose edge was deleted on the canvas comes back unconnected', () => {
    const d = coilCheck();
    const { nodes, edges } = toFlow(d);
    const back = fromFlow(d, nodes, edges.filter((e) => e.id !== 'sparkSeen:answer:yes'));
    const obs = back.steps[1]!;
    expect(obs.kind === 'observation' && obs.answers[0]!.next).toBe(UNCONNECTED);
    expect(toFlow(back).nodes[1]!.data.handles[0]).toEqual({ id: 'answer:yes', label: 'yes', open: true });
  });

  it('a step the draft removed is drawn where it stood in the base version, faded and with nothing to do with it', () => {
    const base = applyEdit(coilCheck(), { type: 'move-steps', moves: [{ id: 'openCoil', position: { x: 480, y: 520 } }] });
    const draft = applyEdit(base, { type: 'remove-steps', ids: ['openCoil'] });
    const removed = diffDocuments(base, draft).removed.map((r) => base.steps.find((s) => s.id === r.id)!);
    const { nodes, edges } = toFlow(draft, { removed });
    const ghost = nodes.find((n) => n.data.change === 'removed')!;
    expect(ghost).toMatchObject({ id: 'removed:openCoil', position: { x: 480, y: 520 }, selectable: false, draggable: false, deletable: false, connectable: false });
    expect(ghost.data.handles).toEqual([]);
    expect(nodes).toHaveLength(4); // the three steps left, and the removed one
    expect(edges.some((e) => e.source === ghost.id || e.target === ghost.id || e.target === 'openCoil')).toBe(false);
  });
});

describe('copy and paste', () => {
  it('pasting into the same procedure gives fresh ids and keeps the branches inside the copy', () => {
    const d = coilCheck();
    const pasted = pasteSteps(d, copySteps(d, new Set(['sparkSeen', 'openCoil'])))!;
    expect(pasted.map((s) => s.id)).toEqual(['sparkSeen1', 'openCoil1']);
    const obs = pasted[0]!;
    expect(obs.kind === 'observation' && obs.answers.map((a) => a.next)).toEqual(['openCoil1', UNCONNECTED]);
    expect(pasted[1]!.position).toEqual({ x: d.steps[3]!.position.x + 40, y: d.steps[3]!.position.y + 40 });
  });

  it('pasting into another procedure keeps ids that are free there, and anything else is refused', () => {
    const d = coilCheck();
    const other = doc([task('prepare')]);
    expect(pasteSteps(other, copySteps(d, new Set(['shorted'])))!.map((s) => s.id)).toEqual(['shorted']);
    expect(pasteSteps(other, 'just some text')).toBeNull();
    expect(pasteSteps(other, JSON.stringify({ format: 'something-else', steps: [] }))).toBeNull();
  });
});

describe('differences from the last published version', () => {
  it('lists added, removed and changed steps by id, ignoring moves on the canvas', () => {
    const base = coilCheck();
    let next = applyEdit(base, { type: 'move-steps', moves: [{ id: 'shorted', position: { x: 999, y: 1 } }] });
    next = applyEdit(next, { type: 'update-step', id: 'openCoil', step: { ...next.steps[3]!, title: 'Open primary winding' } });
    next = applyEdit(next, { type: 'add-steps', steps: [stepFor(next, 'handoff', { x: 0, y: 0 })] });
    next = applyEdit(next, { type: 'remove-steps', ids: ['shorted'] });
    const diff = diffDocuments(base, next);
    expect(diff.added).toEqual([{ id: 'handoff1', title: 'Hand to a senior technician' }]);
    expect(diff.removed).toEqual([{ id: 'shorted', title: 'Finding shorted' }]);
    expect(diff.changed.find((c) => c.id === 'openCoil')?.fields).toEqual(['title']);
    expect(diff.changed.find((c) => c.id === 'coilPrimary')?.fields).toEqual(['bands']);
  });

  it('names the pictures a step gained and lost by their captions, and an emptied list is no change', () => {
    const [pins, probe] = ['0b0f8f0e-6a51-4f0e-9d0a-111111111111', '0b0f8f0e-6a51-4f0e-9d0a-222222222222'];
    const base = coilCheck();
    const withPins = applyEdit(base, { type: 'update-step', id: 'openCoil', step: { ...base.steps[3]!, pictures: [{ id: pins, caption: 'Coil pins' }] } });
    const swapped = applyEdit(withPins, { type: 'update-step', id: 'openCoil', step: { ...withPins.steps[3]!, pictures: [{ id: probe, caption: 'Probe here' }] } });
    const change = diffDocuments(withPins, swapped).changed.find((c) => c.id === 'openCoil');
    expect(change).toMatchObject({ fields: ['pictures'], picturesAdded: ['Probe here'], picturesRemoved: ['Coil pins'] });
    const emptied = applyEdit(base, { type: 'update-step', id: 'openCoil', step: { ...base.steps[3]!, pictures: [] } });
    expect(diffDocuments(base, emptied).changed).toEqual([]);
  });
});

describe('where the editor opens', () => {
  it('frames the start step and its near neighbours at a readable zoom, not the whole procedure', () => {
    const at = (y: number) => ({ position: { x: 0, y } });
    const d = doc([
      { ...task('prep', 'look'), ...at(0) },
      { ...observation('look', { yes: 'ok', no: 'far' }), ...at(200) },
      { ...finding('ok'), ...at(420) },
      { ...finding("far"), ...at(2400) },
    ]);
    const view = openingView(d);
    expect(view.nodes!.map((n) => n.id)).toEqual(['prep', 'look', 'ok']);
    expect(view.minZoom).toBeGreaterThanOrEqual(0.5);
    expect(view.maxZoom).toBe(1);
  });
});
