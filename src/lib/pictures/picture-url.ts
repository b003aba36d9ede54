/** Where a stored reference picture is served: `thumb` (320 px), `phone` (1280 px) or the `full` original. */
export const pictureUrl = (id: string, size: 'thumb' | 'phone' | 'full') => `/api/pictures/${id}/${size}`;

/** What the server accepts (it checks the bytes again), so the author hears at once. */
export const PICTURE_TYPES = ['image/jpeg', 'image/png', 'image/webp'];
export const MAX_PICTURE_BYTES = 8 * 1024 * 1024;

/** Why a file cannot be a reference picture, or null when it may be sent. */
export function pictureProblem(file: { type: string; size: number; name: string }): string | null {
  if (!PICTURE_TYPES.includes(file.type)) return `${file.name} is not a JPEG, PNG or WebP picture (drawings in SVG are not taken: export them as PNG).`;
  if (file.size > MAX_PICTURE_BYTES) return `${file.name} is larger than 8 MB. Save it at a lower resolution and add it again.`;
  return null;
}
