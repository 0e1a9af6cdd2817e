/**
 * Warnings as data: a stable `code` (what happened) and a `text` for people. Repeated warnings are
 * collapsed by code, never by matching their wording. The HTTP layer sends the texts.
 */

export interface Warning {
  code: string;
  text: string;
}

export const warning = (code: string, text: string): Warning => ({ code, text });

/**
 * One warning per code, in the order of first appearance: the first text, with " (N epochs)" when
 * the code came N > 1 times. For warnings raised once per epoch whose text carries no per-epoch
 * number.
 */
export function collapseByCode(warnings: readonly Warning[], unit = 'epochs'): Warning[] {
  const first = new Map<string, { w: Warning; n: number }>();
  for (const w of warnings) {
    const hit = first.get(w.code);
    if (hit) hit.n++;
    else first.set(w.code, { w, n: 1 });
  }
  return [...first.values()].map(({ w, n }) => (n > 1 ? { code: w.code, text: `${w.text} (${n} ${unit})` } : w));
}

export const warningTexts = (warnings: readonly Warning[]): string[] => warnings.map((w) => w.text);
