import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import YAML from 'yaml';
import { designJsonSchema } from '../../src/params/jsonSchema.js';
import type { SchemaNode } from '../../src/live/form.js';
import { EditRefused, LiveSession } from '../../src/live/session.js';
import { demoText } from '../helpers/demo.js';

/** The live session on its own: what is written, when, and what is refused. */

const tmp = mkdtempSync(join(tmpdir(), 'fw-session-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));
const schema = designJsonSchema() as SchemaNode;

function open(name: string, text: string): { s: LiveSession; file: string } {
  const file = join(tmp, name);
  writeFileSync(file, text);
  const s = new LiveSession(file, name, schema);
  s.load();
  return { s, file };
}

describe('LiveSession', () => {
  it('a design that does not build opens with its problems, and an edit that fixes it is written', () => {
    const broken = demoText('mote-3.yaml').replace(/(body:\n  lengthMm: )\d+/, '$110');
    const { s, file } = open('broken.yaml', broken);
    expect(s.model.state).toBe('invalid');
    expect(s.model.problems[0].path).toBe('body.lengthMm');
    expect(s.model.form.length).toBeGreaterThan(5);
    const r = s.applyEdits([{ path: 'body.lengthMm', text: String(YAML.parse(demoText('mote-3.yaml')).body.lengthMm) }]);
    expect(r.ok).toBe(true);
    expect(readFileSync(file, 'utf8')).toBe(demoText('mote-3.yaml'));
    expect(s.model.state).toBe('ok');
  });

  it('↺ removes the key (its default applies) and the next edit can put it back', () => {
    const { s, file } = open('reset.yaml', demoText('tessel-5.yaml'));
    expect(s.applyEdits([{ path: 'props.minTipGapMm', remove: true }]).ok).toBe(true);
    expect(YAML.parse(readFileSync(file, 'utf8')).props.minTipGapMm).toBeUndefined();
    expect(s.model.figures?.tipGaps[0].minMm).toBe(6); // the schema's default
    expect(s.applyEdits([{ path: 'props.minTipGapMm', text: '8' }]).ok).toBe(true);
    expect(YAML.parse(readFileSync(file, 'utf8')).props.minTipGapMm).toBe(8);
  });

  it('several edits go together: written only when together they build', () => {
    const { s, file } = open('together.yaml', demoText('tessel-5.yaml'));
    const before = readFileSync(file, 'utf8');
    const alone = s.applyEdits([{ path: 'arms.style', text: 'tapered' }]);
    expect(alone.ok).toBe(false);
    expect(readFileSync(file, 'utf8')).toBe(before);
    const both = s.applyEdits([
      { path: 'arms.style', text: 'tapered' },
      { path: 'arms.widthMm', text: '14' },
      { path: 'arms.tipWidthMm', text: '10' },
    ]);
    expect(both.ok).toBe(true);
    expect(YAML.parse(readFileSync(file, 'utf8')).arms).toMatchObject({ style: 'tapered', widthMm: 14, tipWidthMm: 10 });
  });

  it('a JSON design stays JSON', () => {
    const json = JSON.stringify(YAML.parse(demoText('farline-7.yaml')), null, 2);
    const { s, file } = open('farline.json', json);
    expect(s.applyEdits([{ path: 'layout.wheelbaseMm', text: '330' }, { path: 'camera.widthMm', text: 'mini' }, { path: 'props.minTipGapMm', text: '7' }]).ok).toBe(true);
    const back = JSON.parse(readFileSync(file, 'utf8'));
    expect([back.layout.wheelbaseMm, back.camera.widthMm, back.props.minTipGapMm]).toEqual([330, 'mini', 7]);
  });

  it('refuses paths outside the design, too many edits and overlong text, writing nothing', () => {
    const { s, file } = open('refuse.yaml', demoText('tessel-5.yaml'));
    const before = readFileSync(file, 'utf8');
    const files = readdirSync(tmp).sort();
    expect(() => s.applyEdits([{ path: 'prototype.x', text: '1' }])).toThrow(EditRefused);
    expect(() => s.applyEdits(Array.from({ length: 65 }, () => ({ path: 'name', text: 'x' })))).toThrow(EditRefused);
    expect(() => s.applyEdits([{ path: 'name', text: 'x'.repeat(5000) }])).toThrow(EditRefused);
    expect(() => s.applyEdits([])).toThrow(EditRefused);
    expect(readFileSync(file, 'utf8')).toBe(before);
    expect(readdirSync(tmp).sort()).toEqual(files);
  });

  it('a change on disk is picked up, and the listeners hear of it', () => {
    const { s, file } = open('disk.yaml', demoText('tessel-5.yaml'));
    const heard: number[] = [];
    s.onChange((m) => heard.push(m.version));
    writeFileSync(file, demoText('tessel-5.yaml').replace(/wheelbaseMm: [\d.]+/, 'wheelbaseMm: 250'));
    expect(s.reloadFromDisk()).toBe(true);
    expect(heard).toEqual([s.version]);
    expect(s.model.figures?.wheelbaseMm).toBe(250);
    // The same text again (an editor touching the file) is not a change.
    expect(s.reloadFromDisk()).toBe(false);
  });
});
