/** A small JPEG of a photo, made on the phone so the server never has to decode pictures. */
export async function makeThumbnail(file: Blob, size = 240): Promise<{ blob: Blob; dataUrl: string } | null> {
  try {
    const bitmap = await createImageBitmap(file);
    const scale = Math.min(1, size / Math.max(bitmap.width, bitmap.height));
    const canvas = document.createElement('canvas');
    canvas.width = Math.max(1, Math.round(bitmap.width * scale));
    canvas.height = Math.max(1, Math.round(bitmap.height * scale));
    canvas.getContext('2d')!.drawImage(bitmap, 0, 0, canvas.width, canvas.height);
    bitmap.close();
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/jpeg', 0.75));
    return blob ? { blob, dataUrl: canvas.toDataURL('image/jpeg', 0.75) } : null;
  } catch {
    return null; // not a picture the browser can read: the server will say so too
  }
}
