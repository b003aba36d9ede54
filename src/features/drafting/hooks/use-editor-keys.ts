import { useEffect, useRef } from 'react';

export interface EditorKeyHandlers {
  undo: () => void;
  redo: () => void;
  layout: () => void;
  fit: () => void;
  preview: () => void;
  copy: () => string | null;
  paste: (text: string) => void;
}

function typing(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  return !!el && (el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName));
}

/**
 * Editor shortcuts, only while focus is not in a form field (so the browser's own text undo
 * and copy keep working there): Ctrl/⌘+Z, Ctrl/⌘+Shift+Z or Ctrl+Y, L (layout), F (fit),
 * P (preview); copy and paste of steps through the system clipboard events.
 */
export function useEditorKeys(handlers: EditorKeyHandlers): void {
  const h = useRef(handlers);
  h.current = handlers;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (typing(e.target)) return;
      const mod = e.ctrlKey || e.metaKey;
      const key = e.key.toLowerCase();
      if (mod && key === 'z') { e.preventDefault(); if (e.shiftKey) h.current.redo(); else h.current.undo(); return; }
      if (mod && key === 'y') { e.preventDefault(); h.current.redo(); return; }
      if (mod || e.altKey) return;
      if (key === 'l') h.current.layout();
      else if (key === 'f') h.current.fit();
      else if (key === 'p') h.current.preview();
    };
    const onCopy = (e: ClipboardEvent) => {
      if (typing(e.target)) return;
      const text = h.current.copy();
      if (text === null || !e.clipboardData) return;
      e.clipboardData.setData('text/plain', text);
      e.preventDefault();
    };
    const onPaste = (e: ClipboardEvent) => {
      if (typing(e.target) || !e.clipboardData) return;
      const text = e.clipboardData.getData('text/plain');
      if (text) { e.preventDefault(); h.current.paste(text); }
    };
    window.addEventListener('keydown', onKey);
    window.addEventListener('copy', onCopy);
    window.addEventListener('paste', onPaste);
    return () => {
      window.removeEventListener('keydown', onKey);
      window.removeEventListener('copy', onCopy);
      window.removeEventListener('paste', onPaste);
    };
  }, []);
}
