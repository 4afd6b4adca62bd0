const fs=require('fs');
for (const f of fs.readdirSync('/tmp/prof').map(x=>'/tmp/prof/'+x)) {
const p=JSON.parse(fs.readFileSync(f));const self=new Map();const dt=p.timeDeltas;const idx=new Map(p.nodes.map((n,i)=>[n.id,n]));
const cnt=new Map();p.samples.forEach((s,i)=>cnt.set(s,(cnt.get(s)||0)+(dt[i]||0)));
for(const [id,t] of cnt){const n=idx.get(id);const k=n.callFrame.functionName+' '+n.callFrame.url.split('/').slice(-2).join('/')+':'+n.callFrame.lineNumber;self.set(k,(self.get(k)||0)+t);}
console.log('==',f, [...cnt.values()].reduce((a,b)=>a+b,0)/1000|0);
console.log([...self].sort((a,b)=>b[1]-a[1]).slice(0,12).map(([k,t])=>(t/1000).toFixed(0)+'ms '+k).join('\n'))}
