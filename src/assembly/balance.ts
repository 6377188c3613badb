import { componentMassBody } from './components.js';
import { addBodies, centreOfMass, inertiaAboutCentre, type MassBody } from './massProps.js';
import { motorMassBody, standoffMassBody } from './parts.js';
import { plateMassBody } from './plates.js';
import type { Assembly, MassBalance } from './types.js';

/** Mass bodies of the assembly by group (g, mm): plates, hardware, motors, components, battery. */
export function massGroups(a: Assembly): Readonly<Record<'frame' | 'hardware' | 'motors' | 'components' | 'battery', MassBody>> {
  return {
    frame: addBodies(a.plates.map((p) => plateMassBody(p.part, p.pose))),
    hardware: addBodies([...a.standoffs, ...a.cameraSpacers].map(standoffMassBody).concat(a.joints.map((j) => j.hardwareMass))),
    motors: addBodies(a.motors.map(motorMassBody)),
    components: addBodies(a.components.filter((c) => c.kind !== 'battery').map(componentMassBody)),
    battery: addBodies(a.components.filter((c) => c.kind === 'battery').map(componentMassBody)),
  };
}

/**
 * Mass and balance: plate masses from exact area × thickness × density, hardware from its
 * dimensions, motors and components as uniform solids of their given mass → all-up mass, centre
 * of gravity (with and without the battery), thrust centre (the motors' centroid in plan), the
 * plan offset between them (also as a share of the mean motor distance) and the inertia tensor
 * about the centre of gravity.
 * @example massBalance(assembly).massG.allUp
 */
export function massBalance(a: Assembly): MassBalance {
  const g = massGroups(a);
  const dry = addBodies([g.frame, g.hardware, g.motors, g.components]);
  const all = addBodies([dry, g.battery]);
  const cg = centreOfMass(all);
  const n = a.motors.length;
  const tx = a.motors.reduce((s, m) => s + m.baseCentreMm[0], 0) / n;
  const ty = a.motors.reduce((s, m) => s + m.baseCentreMm[1], 0) / n;
  const offset = Math.hypot(cg[0] - tx, cg[1] - ty);
  const reach = a.motors.reduce((s, m) => s + Math.hypot(m.baseCentreMm[0] - tx, m.baseCentreMm[1] - ty), 0) / n;
  return {
    massG: { frame: g.frame.massG, hardware: g.hardware.massG, motors: g.motors.massG, components: g.components.massG, battery: g.battery.massG, allUp: all.massG },
    cgMm: cg,
    cgDryMm: centreOfMass(dry),
    thrustCentreMm: [tx, ty],
    cgOffsetMm: offset,
    cgOffsetShare: offset / reach,
    inertiaGMm2: inertiaAboutCentre(all),
  };
}
