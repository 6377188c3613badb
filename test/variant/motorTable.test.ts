import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { classNamed, classTurnsProp, MOTOR_BY_PROP, MOTOR_CLASSES, motorClassesForPattern, motorClassOf, motorForProp } from '../../src/params/motorTable.js';
import { parseDesignText } from '../../src/params/design.js';
import { chooseMotor, designMotorClass } from '../../src/variant/index.js';
import { demoText } from './helpers.js';

describe('motor-size table', () => {
  it('bolt circles and bolt sizes follow domain.md (common practice)', () => {
    // domain.md "Motor mounts": 12xx–18xx 9 or 12 mm M2; 20xx–24xx 16 mm M3; 25xx–28xx 16 or 19 mm M3; 30xx+ 19 or 25 mm M3
    expect(motorClassOf('1404')).toMatchObject({ boltCirclesMm: [9, 12], boltSize: 'M2' });
    expect(motorClassOf('1804')).toMatchObject({ boltCirclesMm: [9, 12], boltSize: 'M2' });
    expect(motorClassOf('2207')).toMatchObject({ boltCirclesMm: [16], boltSize: 'M3' });
    expect(motorClassOf('2306')).toMatchObject({ boltCirclesMm: [16], boltSize: 'M3' });
    expect(motorClassOf('2806.5')).toMatchObject({ boltCirclesMm: [16, 19], boltSize: 'M3' });
    expect(motorClassOf('3115')).toMatchObject({ boltCirclesMm: [19, 25], boltSize: 'M3' });
    expect(motorClassOf('22xx')?.name).toBe('20xx-24xx');
    expect(motorClassOf('20xx-24xx')?.name).toBe('20xx-24xx');
    expect(motorClassOf('1999')).toBeNull();
    expect(motorClassOf('big')).toBeNull();
  });

  it('classes do not overlap in stator size', () => {
    const sorted = [...MOTOR_CLASSES].sort((a, b) => a.statorMinMm - b.statorMinMm);
    for (let i = 1; i < sorted.length; i++) expect(sorted[i].statorMinMm).toBeGreaterThan(sorted[i - 1].statorMaxMm);
  });

  it('the prop-size table covers 1 to 13 in without gaps, and each row names a class that turns its props', () => {
    expect(MOTOR_BY_PROP[0].fromIn).toBe(1);
    expect(MOTOR_BY_PROP[MOTOR_BY_PROP.length - 1].toIn).toBe(13);
    for (let i = 1; i < MOTOR_BY_PROP.length; i++) expect(MOTOR_BY_PROP[i].fromIn).toBe(MOTOR_BY_PROP[i - 1].toIn);
    for (const row of MOTOR_BY_PROP) {
      const c = classNamed(row.className);
      expect(classTurnsProp(c, row.fromIn * 25.4), row.className).toBe(true);
      expect(classTurnsProp(c, (row.toIn - 0.01) * 25.4), row.className).toBe(true);
      expect(c.boltCirclesMm).toContain(row.circleMm);
    }
    // heavier motors for bigger props (common practice)
    for (let i = 1; i < MOTOR_BY_PROP.length; i++) expect(MOTOR_BY_PROP[i].massG).toBeGreaterThan(MOTOR_BY_PROP[i - 1].massG);
    // 5 in = 127 mm exactly (international inch): a 22xx-class row; 7 in a 28xx-class row
    expect(motorForProp(127)?.className).toBe('20xx-24xx');
    expect(motorForProp(177.8)?.className).toBe('25xx-28xx');
    expect(motorForProp(330.2)?.className).toBe('36xx-46xx');
    expect(motorForProp(20)).toBeNull();
    expect(motorForProp(14 * 25.4)).toBeNull();
  });

  it('a 16 mm M3 mount fits two classes', () => {
    expect(motorClassesForPattern([16], 'M3').map((c) => c.name)).toEqual(['20xx-24xx', '25xx-28xx']);
  });

  it('demo designs map to their class by pattern and bell', () => {
    expect(designMotorClass(parseDesignText(demoText('tessel-5'))).cls.name).toBe('20xx-24xx');
    expect(designMotorClass(parseDesignText(demoText('farline-7'))).cls.name).toBe('25xx-28xx');
    expect(designMotorClass(parseDesignText(demoText('mote-3'))).cls.name).toBe('12xx-18xx');
  });

  it('auto takes class and mass from the prop size; keep refuses a prop the mount cannot turn; a named class is taken', () => {
    const d = parseDesignText(demoText('tessel-5'));
    // 7 in: the 28xx-class row, 50 g; the 16 mm M3 mount already fits 25xx-28xx, so only bell, bore, thread depth and mass change
    const seven = chooseMotor(d, undefined, 177.8);
    expect(seven.variantClass.name).toBe('25xx-28xx');
    expect(seven.massG).toBe(50);
    expect(seven.changes.map((c) => c.path.join('.')).sort()).toEqual(['motor.bellDiameterMm', 'motor.boreMm', 'motor.massG', 'motor.threadDepthMm']);
    // the source's own size and row: the motor is kept as it is
    expect(chooseMotor(d, 'auto', 5.1 * 25.4).changes).toEqual([]);
    expect(chooseMotor(d, 'auto', 5.1 * 25.4).massG).toBe(32);
    // 2 in: the smallest class, M2 on a 9 mm circle, and a tip pad for M2's e/D
    const two = chooseMotor(d, 'auto', 50.8);
    expect(two.variantClass.name).toBe('08xx-11xx');
    expect(two.changes.find((c) => c.path.join('.') === 'motor.boltCircleMm')?.new).toEqual([9]);
    expect(() => chooseMotor(d, 'keep', 50.8)).toThrow(/--props: 2 in is outside what the kept motor mount \(16 mm circles, M3/);
    expect(() => chooseMotor(d, '2207', 50.8)).toThrow(/cannot be turned by motor class 20xx-24xx \(16 mm circles, M3\)/);
    expect(() => chooseMotor(d, 'huge', 127)).toThrow(/--motor: huge is not a motor size class/);
    expect(chooseMotor(d, '2806', 177.8).massG).toBe(50);
  });

  it('a slotted two-circle mount whose new bolts are narrower than the bit gets round holes on the table circle', () => {
    // farline-7: 16/19 mm slots, M3. At 3 in the 12xx-18xx class takes M2 (2.4 mm clearance, ISO 273
    // medium) — a slot that narrow cannot be cut with the 3.175 mm bit.
    const d = parseDesignText(demoText('farline-7'));
    const c = Object.fromEntries(chooseMotor(d, 'auto', 76.2).changes.map((x) => [x.path.join('.'), x.new]));
    expect(c['motor.slotted']).toBe(false);
    expect(c['motor.boltCircleMm']).toEqual([9]);
    expect(c['motor.boltSize']).toBe('M2');
  });
});

describe('README motor table', () => {
  it('lists every class and every prop-size row exactly as the code has them', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const section = readme.slice(readme.indexOf('<!-- section:variants -->'), readme.indexOf('<!-- /section:variants -->'));
    for (const c of MOTOR_CLASSES) {
      const row = `| ${c.name} | ${c.boltCirclesMm.join(' or ')} mm | ${c.boltSize} | ${c.propsIn[0]}–${c.propsIn[1]} in | ${c.bellDiameterMm} mm | ${c.boreMm} mm | ${c.massG} g | ${c.threadDepthMm} mm |`;
      expect(section).toContain(row);
    }
    for (const r of MOTOR_BY_PROP) expect(section).toContain(`| ${r.fromIn}–${r.toIn} in | ${r.className} | ${r.circleMm} mm | ${r.massG} g |`);
  });
});
