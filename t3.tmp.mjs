import { Parser, CST, parse } from 'yaml';
const src = `# top
a: 1 # c1
b:
  c: 2   # c2
  d: [1, 2]
stacks:
  - place: middle # pl
    patternsMm: [30.5, 20]
  - { place: front, patternsMm: [20] }
m: { x: 1, y: 2, z: 3 }
e: 5
`;
function remove(src, target) {
  const toks = [...new Parser().parse(src)];
  const doc = toks.find(t=>t.type==='document');
  const logical = new Map([['', []]]);
  CST.visit(doc, (item, path) => {
    if (path.length === 0) return;
    const parent = logical.get(JSON.stringify(path.slice(0,-1)) === '[]' ? '' : JSON.stringify(path.slice(0,-1)));
    const k = item.key && CST.isScalar(item.key) ? item.key.source : path[path.length-1][1];
    const lp = [...parent, k];
    logical.set(JSON.stringify(path), lp);
    if (JSON.stringify(lp) === JSON.stringify(target)) return CST.visit.REMOVE;
  });
  return toks.map(t => CST.stringify(t)).join('');
}
for (const t of [['a'],['b','c'],['b','d'],['stacks',0,'place'],['stacks',1,'place'],['stacks',1,'patternsMm'],['m','x'],['m','y'],['m','z'],['e'],['stacks',0], ['b','d',0]]) {
  const out = remove(src, t);
  console.log('----', JSON.stringify(t)); console.log(out); try { console.log(JSON.stringify(parse(out))); } catch(e) { console.log('ERR', e.message); }
}
