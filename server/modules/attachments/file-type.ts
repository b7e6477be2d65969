// What a file is, read from its first bytes (its "magic"), never from its name or the type the
// browser claims. Only the four kinds Rowpath keeps are recognised; anything else is refused.

export type StoredKind = {
  mime: 'image/jpeg' | 'image/png' | 'image/webp' | 'application/pdf';
  ext: '.jpg' | '.png' | '.webp' | '.pdf';
  image: boolean;
};

const ascii = (bytes: Uint8Array, from: number, text: string) => {
  if (bytes.length < from + text.length) return false;
  for (let i = 0; i < text.length; i++) if (bytes[from + i] !== text.charCodeAt(i)) return false;
  return true;
};

/**
 * Signatures (memory, from the format specifications):
 * - PNG: 89 50 4E 47 0D 0A 1A 0A, then the IHDR chunk (length 13) — PNG specification §5.2, §11.2.2.
 * - JPEG: FF D8 (SOI) followed by another marker FF xx — ITU-T T.81 Annex B.
 * - WebP: "RIFF", a 4-byte size, "WEBP", then a "VP8 ", "VP8L" or "VP8X" chunk — WebP container spec.
 * - PDF: "%PDF-" and a version digit at the start — ISO 32000-1 §7.5.2 (readers accept it later in
 *   the first kilobyte; Rowpath insists on the start, which every writer produces).
 */
export function detectKind(bytes: Uint8Array): StoredKind | null {
  if (
    bytes.length >= 16 &&
    bytes[0] === 0x89 &&
    ascii(bytes, 1, 'PNG') &&
    bytes[4] === 0x0d &&
    bytes[5] === 0x0a &&
    bytes[6] === 0x1a &&
    bytes[7] === 0x0a &&
    ascii(bytes, 12, 'IHDR')
  )
    return { mime: 'image/png', ext: '.png', image: true };
  if (bytes.length >= 4 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff && bytes[3] >= 0xc0 && bytes[3] !== 0xff)
    return { mime: 'image/jpeg', ext: '.jpg', image: true };
  if (ascii(bytes, 0, 'RIFF') && ascii(bytes, 8, 'WEBP') && (ascii(bytes, 12, 'VP8 ') || ascii(bytes, 12, 'VP8L') || ascii(bytes, 12, 'VP8X')))
    return { mime: 'image/webp', ext: '.webp', image: true };
  if (ascii(bytes, 0, '%PDF-') && bytes.length > 5 && bytes[5] >= 0x30 && bytes[5] <= 0x39) return { mime: 'application/pdf', ext: '.pdf', image: false };
  return null;
}

/**
 * A name safe to keep and to offer on download: the last path segment only, no control characters
 * (NUL included), no characters that file systems or headers treat specially, no leading dots, at
 * most 120 characters before the extension — and the extension of what the file really is.
 */
export function safeFileName(clientName: string | undefined, kind: StoredKind): string {
  const lastSegment = (clientName ?? '').split(/[\\/]/).pop() ?? '';
  const cleaned = lastSegment
    .normalize('NFC')
    // Control characters, characters Windows refuses, and the bidirectional overrides that can
    // make "gpj.exe" read as "exe.jpg".
    .replace(/[\u0000-\u001f\u007f-\u009f"*:<>?|\u202a-\u202e\u2066-\u2069]/g, '')
    .trim()
    .replace(/^\.+/, '');
  const stem = cleaned.replace(/\.[^.]*$/, '').trim();
  const chars = Array.from(stem || 'file');
  const short = chars.slice(0, 120).join('').trim() || 'file';
  return `${short}${kind.ext}`;
}
