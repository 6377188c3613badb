import { centreOfMass, inertiaAboutCentre } from './massProps.js';
import type { Assembly, HardwareList, Mat3, MassBalance, Vec3 } from './types.js';

/** Round to 4 decimals (and no −0) so files are byte-stable. */
const r = (x: number): number => Math.round(x * 1e4) / 1e4 + 0;
const v = (p: readonly number[]): number[] => p.map(r);
/** A row-major 3×3 matrix as three rounded rows. */
const rows = (m: Mat3): number[][] => [v(m.slice(0, 3)), v(m.slice(3, 6)), v(m.slice(6, 9))];

/**
 * The `assembly.json` object: mass and balance first (`massG`, `cgMm`, `thrustCentreMm`, …), the
 * stack-up heights, then every placed item with its pose or position (joints with what their screw,
 * nut and washer weigh and where that mass sits: `hardwareMassG`, `hardwareCgMm`, `hardwareInertiaGMm2` about that centre; null when nothing).
 * Numbers rounded to 4 decimals.
 */
export function assemblyReport(a: Assembly, mb: MassBalance) {
  const m = mb.massG;
  const I = mb.inertiaGMm2;
  return {
    units: { length: 'mm', mass: 'g', inertia: 'g·mm²' },
    massG: { frame: r(m.frame), hardware: r(m.hardware), motors: r(m.motors), components: r(m.components), battery: r(m.battery), allUp: r(m.allUp) },
    cgMm: v(mb.cgMm),
    cgDryMm: v(mb.cgDryMm),
    thrustCentreMm: v(mb.thrustCentreMm),
    cgOffsetMm: r(mb.cgOffsetMm),
    cgOffsetShareOfArm: r(mb.cgOffsetShare),
    inertiaGMm2: rows(I),
    armStacking: a.armStacking,
    stackUpMm: Object.fromEntries(Object.entries(a.stackUp).map(([k, x]) => [k, r(x)])),
    plates: a.plates.map((p) => ({
      id: p.id,
      part: p.part.name,
      copy: p.copy + 1,
      orientation: p.orientation,
      zLowMm: r(p.zLowMm),
      thicknessMm: r(p.thicknessMm),
      massG: r(p.massG),
      cgMm: v(p.cgMm),
      pose: { originMm: v(p.pose.originMm), uAxis: v(p.pose.uAxis), vAxis: v(p.pose.vAxis), normal: v(p.pose.normal), mirrored: p.pose.mirrored },
    })),
    standoffs: [...a.standoffs, ...a.cameraSpacers].map((s) => ({
      id: s.id,
      startMm: v(s.startMm),
      axis: v(s.axis),
      lengthMm: r(s.lengthMm),
      shape: s.shape,
      acrossFlatsMm: r(s.acrossFlatsMm),
      material: s.material,
      ends: s.ends,
      screw: s.screw,
      massG: r(s.massG),
    })),
    joints: a.joints.map((j) => ({
      id: j.id,
      kind: j.kind,
      screw: j.screw,
      lengthMm: r(j.screwLengthMm),
      head: j.stud ? null : j.headStandard,
      headAtMm: v(j.headAtMm),
      axis: v(j.axis),
      clamps: j.clamps,
      standoffEnds: j.standoffEnds,
      gripMm: r(j.gripMm),
      nut: j.nut ? j.nut.standard : null,
      endsIn: j.endsIn,
      hardwareMassG: r(j.hardwareMass.massG),
      hardwareCgMm: j.hardwareMass.massG > 0 ? v(centreOfMass(j.hardwareMass)) : null,
      hardwareInertiaGMm2: j.hardwareMass.massG > 0 ? rows(inertiaAboutCentre(j.hardwareMass)) : null,
    })),
    motors: a.motors.map((mo) => ({ site: mo.site, onPlate: mo.onPlate, baseCentreMm: v(mo.baseCentreMm), bellDiameterMm: r(mo.bellDiameterMm), heightMm: r(mo.heightMm), massG: r(mo.massG), threadDepthMm: r(mo.threadDepthMm) })),
    props: a.props.map((p) => ({ site: p.site, centreMm: v(p.centreMm), diameterMm: r(p.diameterMm), bandMm: r(p.bandMm), spin: p.spin })),
    components: a.components.map((c) => ({
      id: c.id,
      kind: c.kind,
      massG: r(c.massG),
      cgMm: v(c.cgMm),
      mountedOn: c.mountedOn,
      mountPointsMm: c.mountPointsMm.map(v),
      boxes: c.boxes.map((b) => ({ centreMm: v(b.centreMm), sizeMm: v(b.halfSizeMm.map((h) => 2 * h) as unknown as Vec3), axes: b.axes.map(v) })),
    })),
  };
}

/** The `hardware.json` object: `{ batchSize, items: [{ item, standard, size, lengthMm, count, countPerBatch, use }] }`. */
export function hardwareReport(list: HardwareList) {
  return { batchSize: list.batchSize, items: list.items.map((i) => ({ item: i.item, standard: i.standard, size: i.size, lengthMm: i.lengthMm, count: i.count, countPerBatch: i.countPerBatch, use: i.use })) };
}

/** Mass and balance in a few lines of text for the terminal. */
export function massBalanceText(mb: MassBalance): string {
  const m = mb.massG;
  // No "-0.0" for a centre of gravity on the centre line.
  const f = (x: number) => (Math.abs(x) < 0.05 ? 0 : x).toFixed(1);
  return [
    `mass: frame ${f(m.frame)} g, hardware ${f(m.hardware)} g, motors ${f(m.motors)} g, components ${f(m.components)} g, battery ${f(m.battery)} g; all-up ${f(m.allUp)} g`,
    `centre of gravity (${mb.cgMm.map(f).join(', ')}) mm; thrust centre (${mb.thrustCentreMm.map(f).join(', ')}) mm; offset ${mb.cgOffsetMm.toFixed(1)} mm (${(mb.cgOffsetShare * 100).toFixed(1)} % of the arm)`,
  ].join('\n');
}

/** The mass-and-balance keys of `assembly.json` alone (for `check --json` and `build --json`). */
export function massBalanceSummary(a: Assembly, mb: MassBalance) {
  const { massG, cgMm, cgDryMm, thrustCentreMm, cgOffsetMm, cgOffsetShareOfArm } = assemblyReport(a, mb);
  return { massG, cgMm, cgDryMm, thrustCentreMm, cgOffsetMm, cgOffsetShareOfArm };
}
