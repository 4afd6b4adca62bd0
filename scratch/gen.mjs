import { generateProject } from '../dist/bench/generate.js';
const [dir, works, dumps] = process.argv.slice(2);
const r = await generateProject(dir, { works: Number(works), partners: Math.min(25, 3 + Math.floor(Math.log10(Number(works)) * 2)), seed: 20261004, partnerDumps: dumps !== '0' });
console.log(JSON.stringify(r));
