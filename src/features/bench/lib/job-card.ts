/** The link a job card carries: it opens the Bench start with machine and procedure picked. */
export function jobCardLink(origin: string, vehicleId: string, procedureSlug: string): string {
  return `${origin}/bench/start?vehicle=${encodeURIComponent(vehicleId)}&procedure=${encodeURIComponent(procedureSlug)}`;
}

/**
 * The link as a QR code image (an SVG data URL, allowed by the CSP's img-src). The encoder is
 * loaded only here, so it stays out of what a phone downloads to reach a step. Error correction
 * level M survives a greasy or creased print.
 */
export async function qrImageFor(link: string): Promise<string> {
  const mod = await import('qrcode');
  const qr = ('default' in mod ? mod.default : mod) as typeof import('qrcode');
  const svg = await qr.toString(link, { type: 'svg', errorCorrectionLevel: 'M', margin: 2, color: { dark: '#000000', light: '#ffffff' } });
  return `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`;
}
