import { describe, expect, it } from 'vitest';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import type { ProcedureDocument } from '@shared/schema';
import { doc, finding, observation, ohmsReading } from '../shared/fixtures';
import { PreviewPanel } from '../../src/features/drafting/components/editor/preview-panel';

const PINS = '0b0f8f0e-6a51-4f0e-9d0a-000000000001';
const PROBE = '0b0f8f0e-6a51-4f0e-9d0a-000000000002';
const SPARK = '0b0f8f0e-6a51-4f0e-9d0a-000000000003';

/** The draft as the editor holds it: the start step carries two pictures, the Finding one. */
function withPictures(): ProcedureDocument {
  const d = doc([
    ohmsReading('pulser', 80, 200, { low: 'shorted', ok: 'sparkSeen', high: 'shorted' }),
    observation('sparkSeen', { yes: 'shorted', no: 'shorted' }),
    finding('shorted'),
  ]);
  const pictures: Record<string, { id: string; caption: string }[]> = {
    pulser: [{ id: PINS, caption: 'Connector pins, latch up' }, { id: PROBE, caption: 'Back-probe the pulser lead here' }],
    shorted: [{ id: SPARK, caption: 'A good spark: blue and snapping' }],
  };
  return { ...d, steps: d.steps.map((s) => (pictures[s.id] ? { ...s, pictures: pictures[s.id] } : s)) };
}

const render = (d: ProcedureDocument) => renderToStaticMarkup(createElement(PreviewPanel, { doc: d, onPath: () => undefined, onClose: () => undefined }));

describe("the editor's technician preview", () => {
  it("shows the current step's pictures as the phone does: the phone rendition in order, with the caption as alt text and under it", () => {
    const html = render(withPictures());
    const step = html.slice(html.indexOf('data-testid="preview-step"'));
    const images = [...step.matchAll(/<img src="([^"]+)" alt="([^"]+)"/g)].map((m) => [m[1], m[2]]);
    expect(images).toEqual([
      [`/api/pictures/${PINS}/phone`, 'Connector pins, latch up'],
      [`/api/pictures/${PROBE}/phone`, 'Back-probe the pulser lead here'],
    ]);
    expect(step).toContain('<figcaption class="mt-1 leading-snug">Back-probe the pulser lead here</figcaption>');
    expect(step).toContain(`href="/api/pictures/${PINS}/full"`);
    // the Finding's picture is not on the start step
    expect(step).not.toContain(SPARK);
  });

  it("an ending shows its pictures too (a Finding's picture of what good looks like)", () => {
    const html = render({ ...withPictures(), start: 'shorted' });
    const ending = html.slice(html.indexOf('data-testid="preview-ending"'));
    expect(html).toContain('data-testid="preview-ending"');
    expect(ending).toContain(`<img src="/api/pictures/${SPARK}/phone" alt="A good spark: blue and snapping"`);
  });

  it('a step without pictures shows no picture strip', () => {
    const html = render({ ...withPictures(), start: 'sparkSeen' });
    expect(html).not.toContain('data-testid="preview-picture"');
    expect(html).not.toContain('Reference pictures');
  });
});
