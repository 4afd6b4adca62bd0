// Subject and qualifier tables → the title each partner gives a work, in the partner's own language.

/** Catalogue languages: English, German, French, and a second English house style. */
export type Lang = 'en' | 'de' | 'fr' | 'en2';

type Phrase = Record<Lang, string>;
const p = (en: string, de: string, fr: string, en2 = en): Phrase => ({ en, de, fr, en2 });

/** Invented subjects of late medieval devotional panels. */
export const SUBJECTS: readonly Phrase[] = [
  p('Madonna and Child', 'Maria mit dem Kind', "Vierge à l'Enfant", 'Virgin and Child'),
  p('Annunciation', 'Verkündigung an Maria', 'Annonciation', 'The Annunciation'),
  p('Adoration of the Magi', 'Anbetung der Könige', 'Adoration des mages', 'Adoration of the Kings'),
  p('Nativity', 'Geburt Christi', 'Nativité'),
  p('Crucifixion', 'Kreuzigung', 'Crucifixion', 'Christ on the Cross'),
  p('Lamentation', 'Beweinung Christi', 'Déploration du Christ'),
  p('Saint Jerome in his Study', 'Hl. Hieronymus im Gehäus', 'Saint Jérôme dans son cabinet'),
  p('Saint Catherine of Alexandria', 'Hl. Katharina von Alexandrien', "Sainte Catherine d'Alexandrie"),
  p('Saint George and the Dragon', 'Hl. Georg im Kampf mit dem Drachen', 'Saint Georges terrassant le dragon'),
  p('Presentation in the Temple', 'Darbringung im Tempel', 'Présentation au Temple'),
  p('Flight into Egypt', 'Flucht nach Ägypten', 'Fuite en Égypte', 'Rest on the Flight into Egypt'),
  p('Pietà', 'Vesperbild', 'Pietà'),
  p('Man of Sorrows', 'Schmerzensmann', 'Christ de pitié'),
  p('Coronation of the Virgin', 'Marienkrönung', 'Couronnement de la Vierge'),
  p('Dormition of the Virgin', 'Marientod', 'Dormition de la Vierge', 'Death of the Virgin'),
  p('Saint Anne with the Virgin and Child', 'Anna Selbdritt', 'Sainte Anne trinitaire'),
  p('Saint Christopher', 'Hl. Christophorus', 'Saint Christophe'),
  p('Saint Barbara', 'Hl. Barbara', 'Sainte Barbe'),
  p('Mass of Saint Gregory', 'Gregorsmesse', 'Messe de saint Grégoire'),
  p('Last Judgement', 'Weltgericht', 'Jugement dernier', 'The Last Judgment'),
  p('Baptism of Christ', 'Taufe Christi', 'Baptême du Christ'),
  p('Resurrection', 'Auferstehung Christi', 'Résurrection'),
  p('Noli me tangere', 'Noli me tangere', 'Noli me tangere'),
  p('Visitation', 'Heimsuchung', 'Visitation'),
  p('Saint Sebastian', 'Hl. Sebastian', 'Saint Sébastien'),
  p('Portrait of a Donor', 'Bildnis eines Stifters', "Portrait d'un donateur"),
];

/** Optional second part of a title; index 0 is "none". */
export const QUALIFIERS: readonly Phrase[] = [
  p('', '', ''),
  p(' with Saints', ' mit Heiligen', ' avec des saints'),
  p(' with Donors', ' mit Stiftern', ' avec donateurs'),
  p(' (left wing)', ' (linker Flügel)', ' (volet gauche)'),
  p(' (right wing)', ' (rechter Flügel)', ' (volet droit)'),
  p(' (central panel)', ' (Mitteltafel)', ' (panneau central)'),
];

/** What a detail photograph shows. */
export const DETAIL_PARTS: readonly Phrase[] = [
  p('donor', 'Stifter', 'donateur'),
  p('angel', 'Engel', 'ange'),
  p('landscape', 'Landschaft', 'paysage'),
  p('head of the Virgin', 'Kopf Mariens', 'tête de la Vierge'),
  p('hands', 'Hände', 'mains'),
];

const DETAIL: Record<Lang, (title: string, part: string) => string> = {
  en: (t, part) => `${t}, detail (${part})`,
  de: (t, part) => `${t}, Detail: ${part}`,
  fr: (t, part) => `${t}, détail (${part})`,
  en2: (t, part) => `${t} - detail of ${part}`,
};

const REPLICA: Phrase = p(
  ' (workshop replica)',
  ' (Werkstattwiederholung)',
  " (réplique d'atelier)",
  ', workshop version',
);

/** The base title of a work in one language. */
export function baseTitle(subject: number, qualifier: number, lang: Lang): string {
  return SUBJECTS[subject][lang] + QUALIFIERS[qualifier][lang];
}

/** Title of a detail photograph catalogued as a work of its own. */
export function detailTitle(whole: string, part: number, lang: Lang): string {
  return DETAIL[lang](whole, DETAIL_PARTS[part][lang]);
}

/** Title of a replica; unlabelled replicas carry the original's title unchanged. */
export function replicaTitle(title: string, labelled: boolean, lang: Lang): string {
  return labelled ? title + REPLICA[lang] : title;
}
