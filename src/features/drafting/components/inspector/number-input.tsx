import { useEffect, useState } from 'react';
import { Input } from '../../../../components/ui/field';

const show = (v: number | undefined, factor: number) => (v === undefined ? '' : String(Number((v / factor).toPrecision(6))));

/**
 * A number typed in the step's display unit and stored in the base unit (values in a procedure
 * are always base units). A decimal comma is accepted; a half-typed number is not committed.
 */
export function NumberInput({ value, factor = 1, onCommit, label, allowEmpty = false, className }: {
  value: number | undefined; factor?: number; onCommit: (v: number | undefined) => void; label: string; allowEmpty?: boolean; className?: string;
}) {
  const [text, setText] = useState(show(value, factor));
  useEffect(() => {
    const parsed = Number(text.replace(',', '.'));
    if (value === undefined ? text !== '' : !(Number.isFinite(parsed) && Math.abs(parsed * factor - value) <= Math.abs(value) * 1e-9)) setText(show(value, factor));
    // only outside changes (undo, another field) rewrite the text
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value, factor]);
  const bad = text.trim() === '' ? !allowEmpty : !Number.isFinite(Number(text.replace(',', '.')));
  // the Input primitive is full width; the wrapper decides how wide the number is
  return (
    <span className={`inline-block shrink-0 ${className ?? 'w-28'}`}>
    <Input
      inputMode="decimal"
      aria-label={label}
      aria-invalid={bad || undefined}
      value={text}
      onChange={(e) => {
        setText(e.target.value);
        const t = e.target.value.trim().replace(',', '.');
        if (t === '' && allowEmpty) onCommit(undefined);
        else if (t !== '' && Number.isFinite(Number(t))) onCommit(Number(t) * factor);
      }}
    />
    </span>
  );
}
