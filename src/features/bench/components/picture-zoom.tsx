import { useEffect, useRef, useState, type PointerEvent } from 'react';

const MIN = 1;
const MAX = 5;
const clamp = (z: number) => Math.min(MAX, Math.max(MIN, z));

/**
 * One reference picture over the whole screen: pinch with two fingers (or use the large + and −
 * buttons, for gloves), drag to move around, Close or Escape to go back to the step.
 */
export default function PictureZoom({ src, caption, onClose }: { src: string; caption: string; onClose: () => void }) {
  const [zoom, setZoom] = useState(1);
  const [shift, setShift] = useState({ x: 0, y: 0 });
  const pointers = useRef(new Map<number, { x: number; y: number }>());
  const pinch = useRef<{ distance: number; zoom: number } | null>(null);
  const close = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    close.current?.focus();
    const key = (e: KeyboardEvent) => { if (e.key === 'Escape') onClose(); };
    window.addEventListener('keydown', key);
    return () => window.removeEventListener('keydown', key);
  }, [onClose]);

  const distance = () => {
    const [a, b] = [...pointers.current.values()];
    return a && b ? Math.hypot(a.x - b.x, a.y - b.y) : 0;
  };
  const down = (e: PointerEvent) => {
    (e.target as Element).setPointerCapture?.(e.pointerId);
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    if (pointers.current.size === 2) pinch.current = { distance: distance(), zoom };
  };
  const move = (e: PointerEvent) => {
    const last = pointers.current.get(e.pointerId);
    if (!last) return;
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    if (pinch.current && pointers.current.size === 2) setZoom(clamp(pinch.current.zoom * (distance() / (pinch.current.distance || 1))));
    else if (zoom > 1) setShift((s) => ({ x: s.x + e.clientX - last.x, y: s.y + e.clientY - last.y }));
  };
  const up = (e: PointerEvent) => {
    pointers.current.delete(e.pointerId);
    if (pointers.current.size < 2) pinch.current = null;
  };
  const step = (by: number) => { const z = clamp(zoom + by); setZoom(z); if (z === 1) setShift({ x: 0, y: 0 }); };
  const btn = 'min-h-12 min-w-12 rounded-lg bg-white px-3 text-2xl font-black text-ink';
  return (
    <div role="dialog" aria-modal="true" aria-label={caption} className="fixed inset-0 z-50 flex flex-col bg-ink" data-testid="picture-zoom">
      <div className="flex items-center gap-2 p-2">
        <button type="button" className={btn} aria-label="Zoom out" disabled={zoom <= MIN} onClick={() => step(-1)}>−</button>
        <button type="button" className={btn} aria-label="Zoom in" disabled={zoom >= MAX} onClick={() => step(1)}>+</button>
        <button ref={close} type="button" className={`${btn} ml-auto text-lg`} onClick={onClose}>Close</button>
      </div>
      <div className="relative flex-1 touch-none overflow-hidden" onPointerDown={down} onPointerMove={move} onPointerUp={up} onPointerCancel={up}>
        <img src={src} alt={caption} draggable={false} className="absolute inset-0 m-auto max-h-full max-w-full select-none object-contain"
          style={{ transform: `translate(${shift.x}px, ${shift.y}px) scale(${zoom})` }} />
      </div>
      <p className="p-3 text-lg font-semibold text-white">{caption}</p>
    </div>
  );
}
