/**
 * Small grammar helpers for messages, kept in one place so every report reads the same.
 */

/** Letters whose spoken name starts with a vowel sound (an M3, an X plate, an 8 mm bit). */
const VOWEL_SOUND_LETTER = /^[AEFHILMNORSX](?=[0-9\s.-]|$)/;

/**
 * The phrase with its indefinite article: "an arm-root bolt hole", "a motor bolt hole", "an M3 screw",
 * "an 8 mm bit", "a 3 mm bit".
 */
export function withArticle(phrase: string): string {
  const p = phrase.trim();
  const vowel =
    /^[aeio]/i.test(p) ||
    (/^u/i.test(p) && !/^(uni|use|usu|ura)/i.test(p)) ||
    VOWEL_SOUND_LETTER.test(p) ||
    /^(8|11|18)(?![0-9])/.test(p) ||
    /^8[0-9]/.test(p);
  return `${vowel ? 'an' : 'a'} ${p}`;
}

/** "1 warning", "2 warnings"; an irregular plural may be given. */
export const plural = (n: number, word: string, many = `${word}s`): string => `${n} ${n === 1 ? word : many}`;
