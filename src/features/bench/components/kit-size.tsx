import { useEffect, useState } from 'react';
import { kitSize, type KitSize } from '../../../lib/offline/pictures';

const megabytes = (bytes: number) => `${(bytes / 1_048_576).toFixed(bytes < 1_048_576 ? 2 : 1)} MB`;

/** What the phone keeps for work without signal, pictures included, so the technician knows what the kit costs. */
export function KitSizeLine({ refresh }: { refresh: unknown }) {
  const [size, setSize] = useState<KitSize | null>(null);
  useEffect(() => { void kitSize().then(setSize, () => setSize(null)); }, [refresh]);
  if (!size || size.versions === 0) return null;
  const procedures = `${size.versions} procedure version${size.versions === 1 ? '' : 's'}`;
  const pictures = `${size.pictures} picture${size.pictures === 1 ? '' : 's'}`;
  return <p className="text-base text-ink-soft" data-testid="kit-size">Kept on this phone for work without signal: {procedures} with {pictures}, {megabytes(size.bytes)}.</p>;
}
