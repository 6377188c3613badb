import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { classTurnsProp, MOTOR_CLASSES, motorClassesForPattern, motorClassOf } from '../../src/params/motorTable.js';
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

  it('classes do not overlap in stator size and cover 12 to 40 mm', () => {
    const sorted = [...MOTOR_CLASSES].sort((a, b) => a.statorMinMm - b.statorMinMm);
    for (let i = 1; i < sorted.length; i++) expect(sorted[i].statorMinMm).toBeGreaterThan(sorted[i - 1].statorMaxMm);
    expect(sorted[0].statorMinMm).toBe(12);
  });

  it('a 16 mm M3 mount fits two classes; their prop range is 4 to 8 in', () => {
    const m = motorClassesForPattern([16], 'M3').map((c) => c.name);
    expect(m).toEqual(['20xx-24xx', '25xx-28xx']);
    expect(classTurnsProp(MOTOR_CLASSES[1], 5 * 25.4)).toBe(true);
    expect(classTurnsProp(MOTOR_CLASSES[1], 2 * 25.4)).toBe(false);
  });

  it('demo designs map to their class by pattern and bell', () => {
    expect(designMotorClass(parseDesignText(demoText('tessel-5'))).cls.name).toBe('20xx-24xx');
    expect(designMotorClass(parseDesignText(demoText('farline-7'))).cls.name).toBe('25xx-28xx');
    expect(designMotorClass(parseDesignText(demoText('mote-3'))).cls.name).toBe('12xx-18xx');
  });

  it('a 2-inch prop on a motor needing 16 mm circles is refused', () => {
    const d = parseDesignText(demoText('tessel-5'));
    expect(() => chooseMotor(d, undefined, 50.8)).toThrow(/--props: 2 in is outside what the kept motor mount \(16 mm circles, M3/);
    expect(() => chooseMotor(d, '2207', 50.8)).toThrow(/cannot be turned by motor class 20xx-24xx \(16 mm circles, M3\)/);
    expect(() => chooseMotor(d, 'huge', 127)).toThrow(/--motor: huge is not a motor size class/);
    // auto picks the class that turns the prop
    expect(chooseMotor(d, 'auto', 50.8).variantClass.name).toBe('12xx-18xx');
    expect(chooseMotor(d, 'auto', 127).changes).toEqual([]);
  });
});

describe('README motor table', () => {
  it('lists every class exactly as the code has it', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const section = readme.slice(readme.indexOf('<!-- section:variants -->'), readme.indexOf('<!-- /section:variants -->'));
    for (const c of MOTOR_CLASSES) {
      const row = `| ${c.name} | ${c.boltCirclesMm.join(' or ')} mm | ${c.boltSize} | ${c.propsIn[0]}–${c.propsIn[1]} in | ${c.bellDiameterMm} mm | ${c.boreMm} mm | ${c.massG} g |`;
      expect(section).toContain(row);
    }
  });
});
