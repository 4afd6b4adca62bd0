import { footprintOf } from '../dist/src/validate/footprint.js';
import { loadShapesFolder } from '../dist/src/validate/files.js';
const s = await loadShapesFolder(process.argv[2] ?? 'shapes');
const f = footprintOf(s.quads);
console.log(JSON.stringify(f, (k, v) => v instanceof Set ? [...v] : v, 1));
