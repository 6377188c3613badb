import { DxfReadError } from './errors.js';
import { num, readPairs, type Pair } from './groupCodes.js';

/** An entity as read: its type, the line where it starts, its own pairs and (POLYLINE) its vertices. */
export type RawEntity = Readonly<{
  type: string;
  line: number;
  pairs: readonly Pair[];
  /** VERTEX entities of a POLYLINE, in order. */
  vertices: readonly RawEntity[];
}>;

export type LayerInfo = Readonly<{ name: string; frozen: boolean; off: boolean }>;

export type Block = Readonly<{ name: string; base: readonly [number, number]; entities: readonly RawEntity[]; line: number }>;

/** The parts of a DXF file the importer uses. Header variables keep their raw pairs. */
export type DxfDocument = Readonly<{
  header: ReadonlyMap<string, readonly Pair[]>;
  layers: ReadonlyMap<string, LayerInfo>;
  blocks: ReadonlyMap<string, Block>;
  entities: readonly RawEntity[];
}>;

/**
 * Read the HEADER, TABLES (layers), BLOCKS and ENTITIES sections of ASCII DXF text. Other sections
 * are skipped. Throws DxfReadError for text that is not DXF, binary DXF, or a file cut off inside
 * a section.
 */
export function parseDocument(text: string, maxPairs: number): DxfDocument {
  const pairs = readPairs(text, maxPairs);
  const header = new Map<string, Pair[]>();
  const layers = new Map<string, LayerInfo>();
  const blocks = new Map<string, Block>();
  let entities: RawEntity[] = [];
  let sawSection = false;
  let i = 0;
  while (i < pairs.length) {
    const p = pairs[i];
    if (p.code === 999) {
      i++;
      continue;
    }
    if (p.code !== 0) throw new DxfReadError(`line ${p.line}: expected group code 0 (SECTION or EOF), found code ${p.code}`);
    const word = p.value.trim();
    if (word === 'EOF') break;
    if (word !== 'SECTION') throw new DxfReadError(`line ${p.line + 1}: expected SECTION or EOF, found ${JSON.stringify(word.slice(0, 40))}; the file is damaged or not DXF`);
    const nameP = pairs[i + 1];
    if (!nameP || nameP.code !== 2) throw new DxfReadError(`line ${p.line}: SECTION without a name (group code 2); the file looks truncated`);
    const end = findEndSec(pairs, i + 2, nameP);
    const body = pairs.slice(i + 2, end);
    sawSection = true;
    switch (nameP.value.trim()) {
      case 'HEADER':
        readHeader(body, header);
        break;
      case 'TABLES':
        readLayers(body, layers);
        break;
      case 'BLOCKS':
        readBlocks(body, blocks);
        break;
      case 'ENTITIES':
        entities = groupEntities(body);
        break;
      default:
        break;
    }
    i = end + 1;
  }
  if (!sawSection) throw new DxfReadError('not a DXF file: no SECTION found');
  return { header, layers, blocks, entities };
}

function findEndSec(pairs: readonly Pair[], from: number, nameP: Pair): number {
  for (let j = from; j < pairs.length; j++) {
    const q = pairs[j];
    if (q.code === 0) {
      const w = q.value.trim();
      if (w === 'ENDSEC') return j;
      if (w === 'SECTION' || w === 'EOF') break;
    }
  }
  throw new DxfReadError(`the ${nameP.value.trim()} section that starts on line ${nameP.line - 2} never ends (no ENDSEC); the file looks truncated`);
}

function readHeader(body: readonly Pair[], header: Map<string, Pair[]>): void {
  let current: Pair[] | null = null;
  for (const p of body) {
    if (p.code === 9) {
      current = [];
      header.set(p.value.trim(), current);
    } else if (current) current.push(p);
  }
}

/** Split a run of pairs at every group code 0 into records (type + following pairs). */
function records(body: readonly Pair[]): Array<{ type: string; line: number; pairs: Pair[] }> {
  const out: Array<{ type: string; line: number; pairs: Pair[] }> = [];
  for (const p of body) {
    if (p.code === 0) out.push({ type: p.value.trim(), line: p.line, pairs: [] });
    else if (out.length) out[out.length - 1].pairs.push(p);
  }
  return out;
}

function readLayers(body: readonly Pair[], layers: Map<string, LayerInfo>): void {
  for (const r of records(body)) {
    if (r.type !== 'LAYER') continue;
    let name: string | null = null;
    let flags = 0;
    let color = 7;
    for (const p of r.pairs) {
      if (p.code === 2) name = p.value.trim();
      else if (p.code === 70) flags = num(p);
      else if (p.code === 62) color = num(p);
    }
    // A LAYER record inside the TABLE header of the layer table itself has no name.
    if (name !== null) layers.set(name, { name, frozen: (flags & 1) !== 0, off: color < 0 });
  }
}

function readBlocks(body: readonly Pair[], blocks: Map<string, Block>): void {
  const recs = records(body);
  let k = 0;
  while (k < recs.length) {
    const r = recs[k];
    if (r.type !== 'BLOCK') {
      k++;
      continue;
    }
    let name = '';
    let bx = 0;
    let by = 0;
    for (const p of r.pairs) {
      if (p.code === 2 && !name) name = p.value.trim();
      else if (p.code === 10) bx = num(p);
      else if (p.code === 20) by = num(p);
    }
    let j = k + 1;
    while (j < recs.length && recs[j].type !== 'ENDBLK' && recs[j].type !== 'BLOCK') j++;
    if (j >= recs.length || recs[j].type !== 'ENDBLK') {
      throw new DxfReadError(`line ${r.line}: block ${JSON.stringify(name)} has no ENDBLK; the file is damaged or truncated`);
    }
    blocks.set(name, { name, base: [bx, by], entities: groupRecords(recs.slice(k + 1, j)), line: r.line });
    k = j + 1;
  }
}

function groupEntities(body: readonly Pair[]): RawEntity[] {
  return groupRecords(records(body));
}

/** Attach VERTEX records to their POLYLINE and drop SEQEND and the attributes that follow an INSERT. */
function groupRecords(recs: ReadonlyArray<{ type: string; line: number; pairs: Pair[] }>): RawEntity[] {
  const out: RawEntity[] = [];
  let k = 0;
  while (k < recs.length) {
    const r = recs[k];
    if (r.type === 'POLYLINE') {
      const vertices: RawEntity[] = [];
      let j = k + 1;
      while (j < recs.length && recs[j].type === 'VERTEX') {
        vertices.push({ type: 'VERTEX', line: recs[j].line, pairs: recs[j].pairs, vertices: [] });
        j++;
      }
      if (j < recs.length && recs[j].type === 'SEQEND') j++;
      out.push({ type: r.type, line: r.line, pairs: r.pairs, vertices });
      k = j;
      continue;
    }
    if (r.type === 'INSERT') {
      out.push({ type: r.type, line: r.line, pairs: r.pairs, vertices: [] });
      let j = k + 1;
      let attribs = false;
      while (j < recs.length && recs[j].type === 'ATTRIB') {
        attribs = true;
        j++;
      }
      if (attribs && j < recs.length && recs[j].type === 'SEQEND') j++;
      k = j;
      continue;
    }
    if (r.type !== 'SEQEND' && r.type !== 'VERTEX') out.push({ type: r.type, line: r.line, pairs: r.pairs, vertices: [] });
    k++;
  }
  return out;
}

/** First value of a header variable's pair with the given code, or undefined. */
export function headerValue(doc: DxfDocument, name: string, code: number): string | undefined {
  return doc.header.get(name)?.find((p) => p.code === code)?.value.trim();
}
