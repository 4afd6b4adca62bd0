// Test helper: a tiny invented project whose record IDs and titles are hostile (markup, script, bidi overrides, emoji).
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { writeTinyProject } from './releases.js';

/** Record IDs and titles of partner `a` (works 1–5); each must render as text, never as markup. */
export const HOSTILE: { id: string; title: string }[] = [
  { id: '<script>alert(1)</script>', title: 'Panel <script>document.title="owned"</script>' },
  { id: '"><img src=x onerror=alert(2)>', title: '"><img src=x onerror=alert(3)> Altarpiece' },
  { id: '\u202eRTL-3', title: 'Madonna \u202egnilliK\u202c \u200f with marks' },
  { id: '🖼️-4', title: 'Saint 🕯️ Lucy 👁️ panel' },
  { id: "x' onmouseover='alert(5)", title: '&lt;b&gt;not bold&lt;/b&gt; &amp; <b>bold?</b>' },
];

/** Writes the project (partner `a` with the hostile records) into `dir` and returns the project file. */
export function writeHostileProject(dir: string): string {
  const file = writeTinyProject(dir, {
    version: '1',
    issued: '2026-06-01',
    evidence: [
      'a:p1,b:p1,0.9,1',
      'a:p2,b:p2,0.93,1',
      'a:p3,c:p3,0.85,1',
      'a:p4,b:p4,0.94,1',
      'a:p5,c:p5,0.95,1',
      'b:p1,c:p1,0.88,1',
    ],
  });
  const rows = [
    'work,photo,title,date',
    ...HOSTILE.map((h, i) => `${csv(h.id)},p${i + 1},${csv(h.title)},1475`),
    ...[6, 7, 8, 9].map((i) => `${i},p${i},Panel A${i},1475`),
  ];
  writeFileSync(path.join(dir, 'catalogues', 'a.csv'), rows.join('\n') + '\n');
  return file;
}

const csv = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
