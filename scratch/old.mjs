// today's gate: chunks by subject with rdf:type copies of the nodes they point to (as chunkOf does), merged by validateChunks
import N3 from 'n3';
import { validateChunks } from '../dist/src/validate/chunked.js';
import { validate } from '../dist/src/validate/shacl.js';
const { namedNode, literal, quad } = N3.DataFactory;
const shapes = new N3.Parser().parse(`@prefix sh: <http://www.w3.org/ns/shacl#> .
<urn:x:S> a sh:NodeShape ; sh:targetClass <urn:x:Link> ;
  sh:property [ sh:path ( <urn:x:generatedBy> <http://www.w3.org/2000/01/rdf-schema#label> ) ; sh:minCount 1 ] .`);
const data = [];
for (let i = 0; i < 50; i++) {
  data.push(quad(namedNode(`urn:x:link${i}`), namedNode('http://www.w3.org/1999/02/22-rdf-syntax-ns#type'), namedNode('urn:x:Link')));
  data.push(quad(namedNode(`urn:x:link${i}`), namedNode('urn:x:generatedBy'), namedNode(`urn:x:run${i % 3}`)));
}
data.push(quad(namedNode('urn:x:run0'), namedNode('http://www.w3.org/2000/01/rdf-schema#label'), literal('run 0')));
const bySubject = new Map();
for (const q of data) { const l = bySubject.get(q.subject.value) ?? []; l.push(q); bySubject.set(q.subject.value, l); }
const types = new Map([...bySubject].map(([s, qs]) => [s, qs.filter((q) => q.predicate.value.endsWith('#type'))]));
const chunks = [...bySubject.values()].map((quads) => ({ quads, context: quads.flatMap((q) => types.get(q.object.value) ?? []) }));
const whole = await validate(data, shapes);
const old = await validateChunks(chunks, shapes, { workers: 0, batchQuads: 10 });
console.log('whole violations', whole.violations, 'chunked (today) violations', old.violations);
