// Date phrases in the partners' own languages (de, fr, it, es, nl, en) → the canonical English phrase the parser reads.
import type { DateLanguage } from '../model.js';

export type { DateLanguage };

/** The languages whose date phrases are read, in the order they are tried when a partner names none. */
export const DATE_LANGUAGES: readonly DateLanguage[] = ['en', 'de', 'fr', 'it', 'es', 'nl'];

type Replacer = (match: string, ...groups: (string | undefined)[]) => string;
/** One rewrite: a global pattern over the lower-cased, accent-stripped phrase and what it becomes. */
type Rule = readonly [RegExp, string | Replacer];

/** A Roman numeral up to 39 (centuries I–XXI are what catalogues write); `c`, `d`, `m` are left out on purpose. */
const R = '((?=[ivx])x{0,3}(?:ix|iv|v?i{0,3}))';
const ROMAN: Readonly<Record<string, number>> = { i: 1, v: 5, x: 10 };

/** `xv` → 15, `15` → 15. */
export function numeral(token: string): number {
  if (/^\d+$/.test(token)) return Number(token);
  let n = 0;
  for (let i = 0; i < token.length; i++) {
    const v = ROMAN[token[i]],
      next = ROMAN[token[i + 1]] ?? 0;
    n += v < next ? -v : v;
  }
  return n;
}

const th = (n: number): string => `${n}th`;
/** `Nth century`, or `Nth-Mth century` for a second numeral. */
const century: Replacer = (_m, a, b) =>
  b === undefined ? `${th(numeral(a!))} century` : `${th(numeral(a!))}-${th(numeral(b))} century`;
/** A decade named inside a century: the seventies of the 15th century = 1470s (the same under either counting). */
const decadeOf = (decade: number, centuryNo: number): string => `${(centuryNo - 1) * 100 + decade}s`;
const TENS: Readonly<Record<string, number>> = {
  venti: 20,
  trenta: 30,
  quaranta: 40,
  cinquanta: 50,
  sessanta: 60,
  settanta: 70,
  ottanta: 80,
  novanta: 90,
};

/** Era words, the same in every pass: written before any `v.`/`n.`/`a.` rule can take them for another word. */
const ERA: readonly Rule[] = [
  [/ ?\b(?:v\.? ?chr|vor christus|voor christus|av\.? ?j\.?-?c|avant j\.?-?c|a\.? ?de ?c|a\.? ?c)\b\.?/g, ' bc'],
  [/ ?\b(?:n\.? ?chr|nach christus|na christus|ap\.? ?j\.?-?c|apres j\.?-?c|d\.? ?de ?c|d\.? ?c)\b\.?/g, ' ad'],
];

/**
 * Each language's rewrites, applied in order after ERA. Centuries become `Nth century`, parts become the English
 * part words (`early`, `mid`, `late`, `first half`, `second quarter`, `last third`, …), approximation words `ca.`,
 * bounds `before`/`after`, ranges `between A and B` / `A to B`, decades `1470s`, Italian century names `1400s`.
 * What the words mean: the languages' ordinary usage in catalogues (common practice, no source); the widths the
 * canonical words then get are in calendar.ts.
 */
const RULES: Readonly<Record<DateLanguage, readonly Rule[]>> = {
  en: [
    [/\b(\d{1,2}(?:st|nd|rd|th))-century\b/g, '$1 century'],
    [
      /\b(first|second|third|fourth|fifth|sixth|seventh|eighth|ninth|tenth|eleventh|twelfth|thirteenth|fourteenth|fifteenth|sixteenth|seventeenth|eighteenth|nineteenth|twentieth|twenty-first)(?=[ -]cent)/g,
      (w) =>
        th(
          [
            'first',
            'second',
            'third',
            'fourth',
            'fifth',
            'sixth',
            'seventh',
            'eighth',
            'ninth',
            'tenth',
            'eleventh',
            'twelfth',
            'thirteenth',
            'fourteenth',
            'fifteenth',
            'sixteenth',
            'seventeenth',
            'eighteenth',
            'nineteenth',
            'twentieth',
            'twenty-first',
          ].indexOf(w) + 1,
        ),
    ],
    [/\b(?:the )?(?:beginning|start) of (?:the )?/g, 'early '],
    [/\b(?:the )?middle of (?:the )?/g, 'mid '],
    [/\b(?:the )?end of (?:the )?/g, 'late '],
    [/\b(?:second|2nd|middle) third\b/g, 'second third'],
    [/\b(?:last|final|third|3rd) third\b/g, 'last third'],
    [/\bfinal quarter\b/g, 'fourth quarter'],
  ],
  de: [
    [
      /\b(\d)0 ?-?er(?: jahre)?(?: des| im)? (\d{1,2})\. ?(?:jh|jhs|jhdts?|jahrhunderts?)\b\.?/g,
      (_m, d, c) => decadeOf(Number(d) * 10, Number(c)),
    ],
    [/\b(\d{3}0) ?-?er(?: jahre)?\b/g, (_m, y) => `${y}s`],
    [/\b(\d{1,2})\.? ?(?:\/|-|bis) ?(\d{1,2})\. ?(?:jh|jhs|jhdts?|jahrhunderts?)\b\.?/g, century],
    [/\b(\d{1,2})\. ?(?:jh|jhs|jhdts?|jahrhunderts?)\b\.?/g, century],
    [/\bzwischen (\d{3,4}) und (\d{1,4})\b/g, 'between $1 and $2'],
    [/\b(?:von )?(\d{3,4}) ?(?:bis|-) ?(\d{1,4})\b/g, '$1-$2'],
    [/\b(?:des|der|dem|die|im|in der|d\.)(?= )/g, ''],
    [/\b(?:1\.|erste[nrs]?) ?(?:halfte|h\.)/g, 'first half'],
    [/\b(?:2\.|zweite[nrs]?) ?(?:halfte|h\.)/g, 'second half'],
    [/\b(?:1\.|erste[nrs]?) ?(?:viertel|v\.)/g, 'first quarter'],
    [/\b(?:2\.|zweite[nrs]?) ?(?:viertel|v\.)/g, 'second quarter'],
    [/\b(?:3\.|dritte[nrs]?) ?(?:viertel|v\.)/g, 'third quarter'],
    [/\b(?:4\.|vierte[nrs]?|letzte[nrs]?) ?(?:viertel|v\.)/g, 'fourth quarter'],
    [/\b(?:1\.|erste[nrs]?) ?drittel/g, 'first third'],
    [/\b(?:2\.|zweite[nrs]?|mittlere[nrs]?) ?drittel/g, 'second third'],
    [/\b(?:3\.|dritte[nrs]?|letzte[nrs]?) ?drittel/g, 'last third'],
    [/\b(?:anfang|beginn|fruhe[nrs]?|fruh|a\.)(?= |-)/g, 'early'],
    [/\b(?:mitte|m\.)(?= |-)/g, 'mid'],
    [/\b(?:ende|spate[nrs]?|spat|e\.)(?= |-)/g, 'late'],
    [/\bnicht (?:vor|fruher als) (?=\d)/g, 'not before '],
    [/\bnicht (?:nach|spater als) (?=\d)/g, 'not after '],
    [/\b(?:um|gegen|etwa)(?: |$)/g, 'ca. '],
    [/\b(?:vor|v\.|bis) ?(?=\d)/g, 'before '],
    [/\b(?:nach|n\.|ab|seit) ?(?=\d)/g, 'after '],
  ],
  fr: [
    [/\b(?:les )?annees (\d{3}0)\b/g, '$1s'],
    [
      new RegExp(`\\bannees (\\d)0 (?:du )?(?:(\\d{1,2})|${R})(?:e|eme|ieme)\\b(?: ?(?:siecle\\b|s\\.))?`, 'g'),
      (_m, d, a, r) => decadeOf(Number(d) * 10, numeral(a ?? r!)),
    ],
    [/\b(\d{1,2})(?:e|eme|ieme)? ?- ?(\d{1,2})(?:e|eme|ieme) ?(?:siecles?\b|s\.)/g, century],
    [/\b(\d{1,2})(?:e|eme|ieme|er|re) ?(?:siecles?\b|s\.)/g, century],
    [new RegExp(`\\b${R}(?:e|eme|ieme|er|re)\\b(?: ?(?:siecles?\\b|s\\.))?`, 'g'), century],
    [new RegExp(`\\b${R} ?(?:siecles?\\b|s\\.)`, 'g'), century],
    [/\bentre (\d{3,4}) et (\d{1,4})\b/g, 'between $1 and $2'],
    [/\b(?:de )?(\d{3,4}) a (\d{1,4})\b/g, '$1-$2'],
    [/\b(?:du|de la|des|de l'|au|le|la|les|l')(?= |\b)/g, ''],
    [/\b(?:1re|1ere|premiere) moitie\b/g, 'first half'],
    [/\b(?:2e|2de|2nde|2eme|seconde|deuxieme) moitie\b/g, 'second half'],
    [/\b(?:1er|premier) quart\b/g, 'first quarter'],
    [/\b(?:2e|2eme|2d|deuxieme|second) quart\b/g, 'second quarter'],
    [/\b(?:3e|3eme|troisieme) quart\b/g, 'third quarter'],
    [/\b(?:4e|4eme|quatrieme|dernier) quart\b/g, 'fourth quarter'],
    [/\b(?:1er|premier) tiers\b/g, 'first third'],
    [/\b(?:2e|2eme|deuxieme|second) tiers\b/g, 'second third'],
    [/\b(?:3e|3eme|troisieme|dernier) tiers\b/g, 'last third'],
    [/\b(?:debut|commencement)\b/g, 'early'],
    [/\bmilieu\b/g, 'mid'],
    [/\bmi-/g, 'mid '],
    [/\bfin\b/g, 'late'],
    [/ (?:env\.|environ)$/g, ' approx.'],
    [/\b(?:vers|v\.|environ|env\.) ?(?=\d|early|mid|late|first|second|third|fourth|last)/g, 'ca. '],
    [/\bpas (?:avant|anterieur a) (?=\d)/g, 'not before '],
    [/\bpas (?:apres|posterieur a) (?=\d)/g, 'not after '],
    [/\b(?:avant|av\.) ?(?=\d)/g, 'before '],
    [/\b(?:apres|ap\.) ?(?=\d)/g, 'after '],
  ],
  it: [
    [
      /\b(?:il )?(due|tre|quattro|cinque|sei|sette|otto|nove)cento\b/g,
      (_m, w) => `${['due', 'tre', 'quattro', 'cinque', 'sei', 'sette', 'otto', 'nove'].indexOf(w!) + 12}00s`,
    ],
    [/'(\d)00\b/g, (_m, h) => `1${h}00s`],
    [
      new RegExp(
        `\\b(?:secc?\\.|secoli|secolo|sec\\b|s\\.) ?(?:${R}|(\\d{1,2}))(?:°|o)?(?: ?- ?(?:${R}|(\\d{1,2}))(?:°|o)?)?\\b`,
        'g',
      ),
      (_m, r1, a1, r2, a2) => century('', r1 ?? a1, r2 ?? a2),
    ],
    [
      new RegExp(
        `\\b(?:${R}|(\\d{1,2}))(?:°|o)?(?: ?- ?(?:${R}|(\\d{1,2}))(?:°|o)?)? ?(?:secolo|secoli|secc?\\.|sec\\b)`,
        'g',
      ),
      (_m, r1, a1, r2, a2) => century('', r1 ?? a1, r2 ?? a2),
    ],
    [/\banni (\d{3}0)\b/g, '$1s'],
    [
      /\banni (?:'?(\d)0|(venti|trenta|quaranta|cinquanta|sessanta|settanta|ottanta|novanta)) (?:del |dell'|nel )?(?:(\d{1,2})th century|1(\d)00s)/g,
      (_m, d, w, c, h) =>
        decadeOf(d !== undefined ? Number(d) * 10 : TENS[w!], c !== undefined ? Number(c) : Number(h) + 11),
    ],
    [/\b(?:tra|fra) (?:il )?(\d{3,4}) e (?:il )?(\d{1,4})\b/g, 'between $1 and $2'],
    [/\bdal (\d{3,4}) al (\d{1,4})\b/g, '$1-$2'],
    [/\b(?:del|dello|della|dei|degli|nel|nella|il|lo|la|al|all')(?= |\b)|\b(?:dell'|l')/g, ''],
    [/\bprima meta\b/g, 'first half'],
    [/\bseconda meta\b/g, 'second half'],
    [/\bprimo quarto\b/g, 'first quarter'],
    [/\bsecondo quarto\b/g, 'second quarter'],
    [/\bterzo quarto\b/g, 'third quarter'],
    [/\b(?:quarto|ultimo) quarto\b/g, 'fourth quarter'],
    [/\bprimo terzo\b/g, 'first third'],
    [/\bsecondo terzo\b/g, 'second third'],
    [/\b(?:terzo|ultimo) terzo\b/g, 'last third'],
    [/\b(?:inizio|inizi|principio|primi anni|primo)\b/g, 'early'],
    [/\b(?:meta|medio|mezzo)\b/g, 'mid'],
    [/\b(?:fine|tardo)\b/g, 'late'],
    [/\b(?:verso|intorno|attorno|circa)(?: a)?(?: |$)/g, 'ca. '],
    [/\b(?:prima|ante|entro) ?(?=\d)/g, 'before '],
    [/\b(?:dopo|post|dal) ?(?=\d)/g, 'after '],
  ],
  es: [
    [
      new RegExp(
        `\\b(?:siglos?|s\\.) ?(?:${R}|(\\d{1,2}))(?:°|o)?(?: ?(?:-|y|al?) ?(?:${R}|(\\d{1,2}))(?:°|o)?)?\\b`,
        'g',
      ),
      (_m, r1, a1, r2, a2) => century('', r1 ?? a1, r2 ?? a2),
    ],
    [/\b(?:decada de|anos) (?:los )?(\d{3}0)\b/g, '$1s'],
    [/\bentre (?:el )?(\d{3,4}) y (?:el )?(\d{1,4})\b/g, 'between $1 and $2'],
    [/\b(?:de|desde) (\d{3,4}) (?:a|hasta) (\d{1,4})\b/g, '$1-$2'],
    [/\b(?:hacia|alrededor de|en torno a|aproximadamente)(?: |$)|\bh\. ?/g, 'ca. '],
    [/\bantes de(?:l)? ?(?=\d)/g, 'before '],
    [/\bdespues de(?:l)? ?(?=\d)/g, 'after '],
    [/\b(?:del|de la|de los|de|el|la|los|las|a)(?= )/g, ''],
    [/\bprimera mitad\b/g, 'first half'],
    [/\bsegunda mitad\b/g, 'second half'],
    [/\bprimer cuarto\b/g, 'first quarter'],
    [/\bsegundo cuarto\b/g, 'second quarter'],
    [/\btercer cuarto\b/g, 'third quarter'],
    [/\b(?:cuarto|ultimo) cuarto\b/g, 'fourth quarter'],
    [/\bprimer tercio\b/g, 'first third'],
    [/\bsegundo tercio\b/g, 'second third'],
    [/\b(?:tercer|ultimo) tercio\b/g, 'last third'],
    [/\b(?:principios|comienzos|inicios)\b/g, 'early'],
    [/\b(?:mediados|mitad)\b/g, 'mid'],
    [/\b(?:finales|fines|final)\b/g, 'late'],
  ],
  nl: [
    [/\b(vroeg|laat|midden)?-?(\d{1,2})(?:e|de|ste)-eeuws\b/g, (_m, p, n) => `${p ?? ''} ${n}th century`],
    [
      new RegExp(`\\b(?:${R}|(\\d{1,2}))(?:e|de|ste)?(?: ?- ?(?:${R}|(\\d{1,2}))(?:e|de|ste)?)? ?eeuw(?:en)?\\b`, 'g'),
      (_m, r1, a1, r2, a2) => century('', r1 ?? a1, r2 ?? a2),
    ],
    [/\b(?:de )?jaren (\d{3}0)\b/g, '$1s'],
    [/\btussen (\d{3,4}) en (\d{1,4})\b/g, 'between $1 and $2'],
    [/\b(?:van )?(\d{3,4}) ?(?:tot(?: en met)?|-) ?(\d{1,4})\b/g, '$1-$2'],
    [/\b(?:van de|van het|in de|de|het)(?= )/g, ''],
    [/\beerste helft\b/g, 'first half'],
    [/\btweede helft\b/g, 'second half'],
    [/\beerste kwart\b/g, 'first quarter'],
    [/\btweede kwart\b/g, 'second quarter'],
    [/\bderde kwart\b/g, 'third quarter'],
    [/\b(?:vierde|laatste) kwart\b/g, 'fourth quarter'],
    [/\beerste derde\b/g, 'first third'],
    [/\btweede derde\b/g, 'second third'],
    [/\blaatste derde\b/g, 'last third'],
    [/\b(?:begin|vroeg)\b/g, 'early'],
    [/\bmidden\b/g, 'mid'],
    [/\b(?:eind|einde|laat)\b/g, 'late'],
    [/\b(?:omstreeks|omstr\.|rond|ongeveer)(?: |$)/g, 'ca. '],
    [/\b(?:voor|v\.) ?(?=\d)/g, 'before '],
    [/\b(?:na|n\.) ?(?=\d)/g, 'after '],
  ],
};

/** A replace callback's arguments without the offset and the whole string that follow the groups. */
function groupsOf(args: unknown[]): [string, ...(string | undefined)[]] {
  let end = 1;
  while (end < args.length && typeof args[end] !== 'number') end++;
  return args.slice(0, end) as [string, ...(string | undefined)[]];
}

const MARKS = /\p{M}/gu;
const SPACES = / {2,}/g;

/**
 * Rewrites a phrase (already lower-cased, spaces collapsed, dashes as `-`) from `language` into the canonical
 * English the free-text parser reads: accents dropped, era words, then the language's rules (RULES), spaces tidied.
 */
export function canonicalPhrase(s: string, language: DateLanguage): string {
  let t = s.normalize('NFD').replace(MARKS, '').replace(/º/g, '°');
  for (const [re, to] of ERA) t = t.replace(re, to as string);
  for (const [re, to] of RULES[language]) {
    const next =
      typeof to === 'string' ? t.replace(re, to) : t.replace(re, (...args: unknown[]) => to(...groupsOf(args)));
    if (next !== t) t = next.replace(SPACES, ' ').trim();
  }
  return t.replace(/ ?- ?/g, '-');
}
