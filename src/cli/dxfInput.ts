import { existsSync } from 'node:fs';
import { basename } from 'node:path';
import { DxfReadError, importDxf, parseSidecarText, resolveImportSettings, type ImportFlags, type ImportLimits, type ImportResult, type ImportSettings } from '../import/index.js';
import { readText, UsageError } from './io.js';

/** The sidecar beside a DXF: `arm.dxf` → `arm.dxf.yaml`, if present. */
export const sidecarPath = (dxfPath: string): string => `${dxfPath}.yaml`;

/**
 * A DXF file given to a command, imported with its flags merged over its sidecar. `text` is the
 * file as `readDxfText` read it (commands read it before loading any stage, so a file that is not
 * DXF is refused at once). `requireThickness` names the command that cannot do without one.
 * Unreadable file, bad sidecar or bad flags → UsageError naming the file (exit 2).
 */
export function importDxfFile(path: string, text: string, flags: ImportFlags, requireThickness?: string, limits?: ImportLimits): { imported: ImportResult; settings: ImportSettings } {
  const side = sidecarPath(path);
  try {
    const sidecar = existsSync(side) ? parseSidecarText(readText(side, 'a sidecar file (YAML)'), side) : {};
    const settings = resolveImportSettings(flags, sidecar);
    if (requireThickness && settings.thicknessMm === undefined) {
      throw new UsageError(`${path}: give the plate thickness with --thickness MM (or thicknessMm in ${basename(side)}); ${requireThickness}`);
    }
    return { imported: importDxf(text, { name: basename(path).replace(/\.dxf$/i, ''), ...settings, ...(limits ? { limits } : {}) }), settings };
  } catch (e) {
    if (e instanceof DxfReadError) throw new UsageError(`${path}: ${e.message}`);
    throw e;
  }
}
