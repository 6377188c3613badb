import type { Command } from 'commander';
import { basename, join } from 'node:path';
import type { ArmResult, BodyResult, FrameModalResult, FrameModes, ModalResult } from '../../analysis/index.js';
import { DEFAULT_THRUST_N } from '../../analysis/defaults.js';
import { fmt } from '../../export/format.js';
import type { Part } from '../../geometry/index.js';
import { readDesign, readDxfText, UsageError, writeAllAtomically, type OutputFile } from '../io.js';
import { textTable } from '../table.js';

type ModesCliOptions = {
  part?: string;
  modes?: string;
  json?: boolean;
  plot?: string;
  meshSize?: string;
  motorMass?: string;
  stackMass?: string;
  batteryMass?: string;
  cameraMass?: string;
  thrust?: string;
  thickness?: string;
  material?: string;
  units?: string;
  layers?: string;
};

const CAUTIONS = [
  'Natural frequencies and deflections are estimates from a finite-element model (plates as shells, bolted joints as rigid screw-head footprints, standoffs as beams, motors and components as rigid masses), not a certification: real joints slip and bed in, which lowers the modes. Flight tests decide.',
  'Test a new frame with props off first. Cutting carbon plate makes respirable, electrically conductive dust: cut wet or with on-tool extraction (H-class/HEPA), wear a P3/P100 respirator and eye protection; follow local regulations and the shop practice.',
];

const METHOD =
  'Flat shell triangles on a constrained Delaunay mesh of the exact outline and holes: discrete Kirchhoff–Mindlin bending (DKT with transverse shear, κ = 5/6, G13 = G12) and Allman membrane, orthotropic laminate stiffness from the material constants rotated by the weave angle (classical laminate theory), lumped mass; the assembled frame adds rigid screw-head footprints through the stack, Timoshenko beam standoffs and rigid motor and component masses; shift-invert block Lanczos on a supernodal sparse Cholesky factor in an approximate-minimum-degree order.';

/** A whole number or decimal flag within a range; bad values are usage errors naming the flag. */
function numberFlag(name: string, text: string | undefined, min: number, max: number, integer = false): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (!Number.isFinite(v) || (integer && !Number.isInteger(v)) || v < min || v > max) {
    throw new UsageError(`${name} ${JSON.stringify(text)}: must be ${integer ? 'a whole number' : 'a number'} from ${min} to ${max}`);
  }
  return v;
}

type Loaded = Readonly<{ label: string; result: FrameModes }>;

/** Assembled-frame modes solved for a comparison, at least (enough to hold the first twist and bending modes). */
const COMPARED_FRAME_MODES = 8;

/** Analyse one input: a design file (every part, arms, unibody body) or a DXF drawing (each part, free–free). */
async function analyse(path: string, opts: ModesCliOptions, comparing = false): Promise<Loaded> {
  const common = {
    modes: numberFlag('--modes', opts.modes, 1, 50, true) ?? 6,
    meshSizeMm: numberFlag('--mesh-size', opts.meshSize, 0.3, 20),
    motorMassG: numberFlag('--motor-mass', opts.motorMass, 0, 2000),
    stackMassG: numberFlag('--stack-mass', opts.stackMass, 0, 2000),
    batteryMassG: numberFlag('--battery-mass', opts.batteryMass, 0, 5000),
    cameraMassG: numberFlag('--camera-mass', opts.cameraMass, 0, 2000),
    thrustN: numberFlag('--thrust', opts.thrust, 0.1, 500),
  };
  const options = Object.fromEntries(Object.entries(common).filter((e): e is [string, number] => e[1] !== undefined));
  try {
    if (/\.dxf$/i.test(path)) return { label: basename(path), result: await dxfModes(path, opts, options) };
    const design = await readDesign(path);
    const [{ buildFrame }, { frameModes, defaultMeshSizeMm }, { refuseLargeMeshes }] = await Promise.all([import('../../geometry/index.js'), import('../../analysis/index.js'), import('../../analysis/meshLimit.js')]);
    let frame = buildFrame(design);
    if (opts.part) {
      const keep = frame.parts.filter((p) => p.name === opts.part);
      if (!keep.length) throw new UsageError(`--part ${JSON.stringify(opts.part)}: no such part in ${path} (parts: ${frame.parts.map((p) => p.name).join(', ')})`);
      // A unibody's body model is the bottom plate: it runs only when that is the part asked for.
      frame = { ...frame, parts: keep };
    }
    refuseLargeMeshes(frame.parts, (p) => options.meshSizeMm ?? defaultMeshSizeMm(p), !opts.part);
    // A comparison needs each frame's first twist and bending modes: ask for at least eight.
    const frameCount = comparing ? Math.max(options.modes ?? 6, COMPARED_FRAME_MODES) : undefined;
    return { label: frame.name, result: frameModes(frame, { ...options, assembled: !opts.part, ...(frameCount ? { assembledModes: frameCount } : {}) }) };
  } catch (e) {
    if (e instanceof RangeError) throw new UsageError(`${path}: ${e.message}`);
    const { FloatingPartError } = await import('../../analysis/index.js');
    if (e instanceof FloatingPartError) throw new UsageError(`${path}: ${e.message}; check its joints (arm root, standoff and motor holes) in the design`);
    throw e;
  }
}

async function dxfModes(path: string, opts: ModesCliOptions, options: Record<string, number>): Promise<FrameModes> {
  const text = readDxfText(path);
  const [{ importDxfFile }, { armModes, armTipDeflection, partModes, defaultMeshSizeMm }, { MAX_MESH_NODES, refuseLargeMeshes }, { DEFAULT_LIMITS }] = await Promise.all([
    import('../dxfInput.js'),
    import('../../analysis/index.js'),
    import('../../analysis/meshLimit.js'),
    import('../../import/limits.js'),
  ]);
  // Every line and arc becomes at least one mesh node: a drawing beyond the mesh limit is refused while it is read.
  const limits = { ...DEFAULT_LIMITS, maxSegments: MAX_MESH_NODES, reason: `modes meshes at most ${MAX_MESH_NODES} nodes in one model and every line and arc of the drawing needs one` };
  const { imported } = importDxfFile(path, text, opts, 'modes depend on it', limits);
  let parts: Part[] = imported.parts;
  if (opts.part) parts = parts.filter((p) => p.name === opts.part);
  if (!parts.length) throw new UsageError(`${path}: no closed part${opts.part ? ` named ${JSON.stringify(opts.part)}` : ''} to analyse`);
  // A part whose contours cross (or that has any other drawing error) has no plate to mesh.
  for (const p of parts) {
    const broken = imported.findings.find((f) => f.severity === 'error' && f.rule.startsWith('dxf-') && f.part === p.name);
    if (broken) throw new UsageError(`${path}: part ${p.name} cannot be analysed: ${broken.rule}: ${broken.message.split('\n')[0]} (\`framewright check ${path}\` lists every problem)`);
  }
  refuseLargeMeshes(parts, (p) => options.meshSizeMm ?? defaultMeshSizeMm(p));
  const results = parts.map((p) => partModes(p, options));
  // A drawing that marks motor and root bolts (it does not, unless a sidecar says so) would also get arm results.
  const arms: ArmResult[] = parts
    .filter((p) => p.features.some((f) => f.purpose === 'arm-root-bolt') && p.features.some((f) => f.purpose === 'motor-bolt'))
    .map((p) => ({ modal: armModes(p, options), statics: armTipDeflection(p, options.thrustN ?? DEFAULT_THRUST_N, options.meshSizeMm) }));
  return { frame: basename(path), motorMassG: options.motorMassG ?? 0, thrustN: options.thrustN ?? DEFAULT_THRUST_N, parts: results, arms, body: null, rootTwist: null, assembled: null };
}

const BOUNDARY_WORDS: Record<ModalResult['boundary'], string> = {
  free: 'free, as cut',
  'arm-root-clamped': 'held at its root bolts, carrying its motor',
  'body-with-motors': 'free, carrying its motors (one-piece frame)',
};

/** Plain data for JSON: everything but the mesh and the shape vectors. */
function modalJson(r: ModalResult) {
  const { mesh: _mesh, modes, ...rest } = r;
  return {
    ...rest,
    modes: modes.map(({ shape: _s, ...m }) => m),
  };
}

function frameJson(input: string, r: FrameModes) {
  return {
    input,
    motorMassG: r.motorMassG,
    thrustN: r.thrustN,
    parts: r.parts.map(modalJson),
    arms: r.arms.map((a) => ({ ...modalJson(a.modal), statics: a.statics })),
    body: r.body ? { ...modalJson(r.body.modal), twist: r.body.twist, tipDeflections: r.body.tipDeflections } : null,
    rootTwist: r.rootTwist,
    // The assembled frame; a drawing or a single part has no frame model (modes empty).
    frame: { name: r.frame, ...(r.assembled ? assembledJson(r.assembled) : { modes: [] }) },
  };
}

const round = (x: number, digits: number) => Number(x.toFixed(digits));

/** The assembled frame's modes for JSON: what moves, where the energy is, what the gyro and camera feel. */
function assembledJson(a: FrameModalResult) {
  return {
    nodes: a.nodes,
    dof: a.dof,
    massG: round(a.massG, 2),
    motors: a.frame.motors.map((m) => m.site),
    rotationBand: a.rotationBand,
    modes: a.modes.map((m) => ({
      index: m.index,
      frequencyHz: round(m.frequencyHz, 2),
      name: m.name,
      kind: m.kind,
      motorsZ: m.motorsZ.map((z) => round(z, 4)),
      sharesByPart: Object.fromEntries(Object.entries(m.sharesByPart).map(([k, v]) => [k, round(v, 4)])),
      flightController: m.flightController && { displacementRatio: round(m.flightController.displacementRatio, 4), rotationDegPerMm: round(m.flightController.rotationDegPerMm, 4) },
      camera: m.camera && { displacementRatio: round(m.camera.displacementRatio, 4), rotationDegPerMm: round(m.camera.rotationDegPerMm, 4) },
      inRotationBand: m.inRotationBand,
    })),
  };
}

/** The assembled frame's table: frequency, name, motor motion, gyro and camera, the part holding most energy, band flag. */
function assembledText(a: FrameModalResult): string {
  const sites = a.frame.motors.map((m) => m.site).join(', ');
  const head = `assembled frame — free in space (${a.nodes} nodes, ${a.dof} DOF, ${fmt(a.massG, 1)} g)`;
  const band = a.rotationBand ? `  motors' rotation band ${fmt(a.rotationBand.lowHz, 0)}–${fmt(a.rotationBand.highHz, 0)} Hz (${a.rotationBand.source}); * marks a mode inside it` : '';
  const rows = a.modes.map((m) => {
    const top = Object.entries(m.sharesByPart).sort((x, y) => y[1] - x[1] || x[0].localeCompare(y[0]))[0];
    return [
      `${m.index}${m.inRotationBand ? '*' : ''}`,
      fmt(m.frequencyHz, 0),
      m.name,
      m.motorsZ.map((z) => fmt(z, 2)).join(' '),
      m.flightController ? fmt(m.flightController.rotationDegPerMm, 3) : '',
      m.camera ? fmt(m.camera.rotationDegPerMm, 3) : '',
      top ? `${top[0]} ${fmt(100 * top[1], 0)} %` : '',
    ];
  });
  const table = textTable(['#', 'Hz', 'mode', `motors z (${sites})`, 'FC tilt °/mm', 'camera °/mm', 'most strain energy'], rows);
  return `${head}\n${table
    .split('\n')
    .map((l) => `  ${l}`)
    .join('\n')}\n${band}\n`;
}

function modalText(r: ModalResult): string {
  const head = `${r.part} — ${BOUNDARY_WORDS[r.boundary]} (${fmt(r.thicknessMm, 2)} mm, weave ${fmt(r.weaveDeg, 1)}°, mesh ${fmt(r.meshSizeMm, 2)} mm, ${r.dof} DOF${r.addedMasses.length ? `, added ${fmt(r.addedMasses.reduce((s, m) => s + m.massG, 0), 1)} g` : ''})`;
  const stack = r.stackAtMm !== null;
  const rows = r.modes.map((m) => [String(m.index), fmt(m.frequencyHz, 0), m.description, ...(stack ? [fmt(m.stack!.displacementRatio, 3), fmt(m.stack!.tiltDegPerMm, 3)] : [])]);
  const header = ['#', 'Hz', 'shape', ...(stack ? ['stack move', 'stack tilt °/mm'] : [])];
  return `${head}\n${textTable(header, rows)
    .split('\n')
    .map((l) => `  ${l}`)
    .join('\n')}\n`;
}

function frameText(r: FrameModes): string {
  const out = [`framewright modes: ${r.frame} (motor ${fmt(r.motorMassG, 1)} g each, thrust ${fmt(r.thrustN, 1)} N per motor)`, ''];
  if (r.assembled) out.push(assembledText(r.assembled));
  if (r.body) {
    out.push(modalText(r.body.modal));
    out.push(`  body twist under opposite thrusts (${r.body.twist.pattern}): ${fmt(r.body.twist.twistDeg, 3)}°`);
    out.push(`  arm tip deflection, plate held at its standoffs: ${r.body.tipDeflections.map((t) => `${t.site} ${fmt(t.tipDeflectionMm, 3)} mm`).join(', ')}`, '');
  }
  for (const a of r.arms) {
    out.push(modalText(a.modal));
    out.push(`  tip deflection under ${fmt(a.statics.thrustN, 1)} N: ${fmt(a.statics.tipDeflectionMm, 3)} mm (${fmt(a.statics.stiffnessNPerMm, 1)} N/mm)`, '');
  }
  if (r.rootTwist) out.push(`body twist under opposite thrusts (${r.rootTwist.pattern}): ${fmt(r.rootTwist.twistDeg, 3)}°`, '');
  for (const p of r.parts) out.push(modalText(p));
  out.push('"stack move": translation at the flight-controller stack as a fraction of the mode\'s largest motion; "stack tilt": its tilt per mm of that motion (what a gyro feels).');
  out.push(...CAUTIONS, '');
  return out.join('\n');
}

/** One row per design of the figures that decide between layouts. */
function comparisonText(items: readonly Loaded[]): string {
  const cell = (x: number | undefined, d: number) => (x === undefined ? '' : fmt(x, d));
  const firstArm = (r: FrameModes) => (r.arms.length ? Math.min(...r.arms.map((a) => a.modal.modes[0]?.frequencyHz ?? Infinity)) : undefined);
  const worstTip = (r: FrameModes) => (r.arms.length ? Math.max(...r.arms.map((a) => a.statics.tipDeflectionMm)) : r.body ? Math.max(...r.body.tipDeflections.map((t) => t.tipDeflectionMm)) : undefined);
  const alternate = (b: BodyResult | null) => b?.modal.modes.find((m) => /alternately/.test(m.description));
  const bottomFree = (r: FrameModes) => r.parts.find((p) => p.role === 'bottom')?.modes[0]?.frequencyHz;
  const firstOf = (r: FrameModes, kinds: readonly string[]) => r.assembled?.modes.find((m) => kinds.includes(m.kind))?.frequencyHz;
  const twist = (r: FrameModes) => firstOf(r, ['body twist']);
  const bending = (r: FrameModes) => firstOf(r, ['pitch bending', 'roll bending']);
  const base = items[0].result;
  const change = (r: FrameModes, x: number | undefined, ref: number | undefined) => (r === base || x === undefined || ref === undefined || ref === 0 ? '' : `${x >= ref ? '+' : ''}${fmt((100 * (x - ref)) / ref, 1)} %`);
  const header = ['design', 'frame twist Hz', 'vs first', 'frame bending Hz', 'vs first', 'bottom plate 1st Hz', 'arm+motor 1st Hz', 'body+motors 1st Hz', 'alternating mode Hz', 'stack tilt °/mm', 'tip defl. mm', 'body twist °'];
  const rows = items.map(({ label, result: r }) => {
    const alt = alternate(r.body);
    return [
      label,
      cell(twist(r), 0),
      change(r, twist(r), twist(base)),
      cell(bending(r), 0),
      change(r, bending(r), bending(base)),
      cell(bottomFree(r), 0),
      cell(firstArm(r), 0),
      cell(r.body?.modal.modes[0]?.frequencyHz, 0),
      cell(alt?.frequencyHz, 0),
      cell(alt?.stack?.tiltDegPerMm, 3),
      cell(worstTip(r), 3),
      cell((r.body?.twist ?? r.rootTwist)?.twistDeg, 3),
    ];
  });
  return `framewright modes: comparison (thrust ${fmt(items[0].result.thrustN, 1)} N per motor; blank: not modelled for that design)\n${textTable(header, rows)}\n\n`;
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');

async function plotFiles(dir: string, prefix: string, r: FrameModes, parts: ReadonlyMap<string, Part>): Promise<OutputFile[]> {
  const [{ modeShapeSvg }, { frontWord }, { frameModeSvg }, { frameModeShape }] = await Promise.all([import('../../export/svgModes.js'), import('../../export/svgPart.js'), import('../../export/svgFrameModes.js'), import('../../analysis/frameShape.js')]);
  const frame = r.assembled;
  const framePictures: OutputFile[] = frame
    ? frame.modes.map((mode) => ({
        path: join(dir, `${prefix}frame-mode${mode.index}.svg`),
        data: frameModeSvg({ title: `${r.frame} · assembled frame · mode ${mode.index}`, frequencyHz: mode.frequencyHz, name: mode.name, notes: [frameModeNotes(mode)], shape: frameModeShape(frame, mode) }),
      }))
    : [];
  const all: ModalResult[] = [...r.parts, ...r.arms.map((a) => a.modal), ...(r.body ? [r.body.modal] : [])];
  return framePictures.concat(all.flatMap((m) => {
    const part = parts.get(m.part);
    const loops = part ? [part.outline, ...part.features.map((f) => f.loop)] : [];
    return m.modes.map((mode) => {
      const n = m.mesh.xy.length / 2;
      const inPlane = mode.plane === 'in-plane';
      const w = Float64Array.from({ length: n }, (_, i) => (inPlane ? Math.hypot(mode.shape[6 * i], mode.shape[6 * i + 1]) : mode.shape[6 * i + 2]));
      return {
        path: join(dir, `${prefix}${slug(m.part)}-${m.boundary}-mode${mode.index}.svg`),
        data: modeShapeSvg({
          title: `${r.frame} · ${m.part} · mode ${mode.index}`,
          subtitle: `${BOUNDARY_WORDS[m.boundary]}; ${fmt(m.thicknessMm, 2)} mm plate${m.stackAtMm ? '; + marks the flight-controller stack' : ''}`,
          frequencyHz: mode.frequencyHz,
          description: mode.description,
          xy: m.mesh.xy,
          triangles: m.mesh.triangles,
          w,
          loops,
          ...(part ? { front: frontWord(part) } : {}),
          ...(m.stackAtMm ? { markerMm: m.stackAtMm } : {}),
          ...(inPlane ? { legend: ['', 'still', 'moving'] as const, legendCaption: 'in-plane displacement, relative to the largest' } : {}),
        }),
      };
    });
  }));
}

/** One line under a frame mode's picture: what the gyro and the camera feel, and where the strain energy is. */
function frameModeNotes(m: FrameModalResult['modes'][number]): string {
  const top = Object.entries(m.sharesByPart).sort((x, y) => y[1] - x[1] || x[0].localeCompare(y[0]))[0];
  return [
    m.flightController ? `flight controller tilts ${fmt(m.flightController.rotationDegPerMm, 3)}°/mm` : '',
    m.camera ? `camera ${fmt(m.camera.rotationDegPerMm, 3)}°/mm` : '',
    top ? `most strain energy: ${top[0]} ${fmt(100 * top[1], 0)} %` : '',
    m.inRotationBand ? "inside the motors' rotation band" : '',
  ]
    .filter(Boolean)
    .join('; ');
}

export function registerModes(program: Command): void {
  program
    .command('modes')
    .description('natural frequencies and mode shapes of the assembled frame (named as a pilot sees them, against the motors\' rotation band), each arm as built with its motor, and every plate; arm-tip deflection and body twist; compare several designs side by side')
    .argument('<inputs...>', 'design files (YAML or JSON), or DXF drawings (.dxf, with --thickness); two or more print a comparison table')
    .option('--part <name>', 'only this part')
    .option('--modes <n>', 'modes per model, 1 to 50 (default 6)')
    .option('--json', 'print the results as JSON')
    .option('--plot <dir>', 'write one SVG per mode into this directory: each assembled-frame mode in plan and side view, each plate mode as a colour map')
    .option('--mesh-size <mm>', 'element size in mm, 0.3 to 20 (default: a thirtieth of √area, 0.5 to 4 mm)')
    .option('--motor-mass <g>', 'mass of one motor in g (default: the design\'s motor.massG; 0 for DXF)')
    .option('--stack-mass <g>', 'flight-controller stack on the stack holes, g (one-piece frames; default 0)')
    .option('--battery-mass <g>', 'battery, spread over the standoff holes, g (one-piece frames; default 0)')
    .option('--camera-mass <g>', 'camera, at the front standoffs, g (one-piece frames; default 0)')
    .option('--thrust <N>', `thrust of one motor for the static figures, N (default ${DEFAULT_THRUST_N})`)
    .option('--thickness <mm>', 'DXF only: plate thickness in mm (or thicknessMm in the sidecar FILE.dxf.yaml)')
    .option('--material <name>', 'DXF only: material name (woven-cf, or one defined in the sidecar)')
    .option('--units <unit>', 'DXF only: drawing units mm, cm, m, in, ft, mil, um, dm (overrides $INSUNITS)')
    .option('--layers <a,b>', 'DXF only: the layers that hold cut geometry')
    .action(async (inputs: string[], opts: ModesCliOptions) => {
      const items: Array<Loaded & { path: string }> = [];
      for (const path of inputs) items.push({ path, ...(await analyse(path, opts, inputs.length > 1)) });
      if (opts.plot) {
        const { buildFrame } = await import('../../geometry/index.js');
        const files: OutputFile[] = [];
        for (const it of items) {
          const parts = new Map<string, Part>();
          if (!/\.dxf$/i.test(it.path)) for (const p of buildFrame(await readDesign(it.path)).parts) parts.set(p.name, p);
          files.push(...(await plotFiles(opts.plot, items.length > 1 ? `${slug(it.label)}-` : '', it.result, parts)));
        }
        writeAllAtomically(files, opts.plot);
      }
      if (opts.json) {
        const body = {
          units: { length: 'mm', frequency: 'Hz', mass: 'g', force: 'N', angle: 'deg' },
          method: METHOD,
          cautions: CAUTIONS,
          designs: items.map((it) => frameJson(it.path, it.result)),
        };
        process.stdout.write(`${JSON.stringify(body, null, 2)}\n`);
      } else {
        const text = (items.length > 1 ? comparisonText(items) : '') + items.map((it) => frameText(it.result)).join('\n');
        process.stdout.write(text);
      }
    });
}
