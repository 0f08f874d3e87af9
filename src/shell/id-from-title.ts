/**
 * A file-name-safe id from a title people typed, keeping its letters: accents are dropped
 * ("Förderband 3" → "forderband-3"), a few letters that do not decompose are spelled out
 * ("Straße" → "strasse"), and anything else that is not a letter or digit becomes "-".
 */
const SPELLED: Record<string, string> = { ß: 'ss', æ: 'ae', œ: 'oe', ø: 'o', ł: 'l', đ: 'd', ð: 'd', þ: 'th', ı: 'i' };

export function idFromTitle(title: string, maxLength = 60): string {
  return title
    .toLowerCase()
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .replace(/[ßæœøłđðþı]/g, (c) => SPELLED[c] ?? c)
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, maxLength)
    .replace(/-+$/, '');
}
