/**
 * Capture presets: how the shop's kit is usually wired (sensor, channel roles and scales, reference
 * kind), so a technician does not enter them for every file. Built-in presets cover the common
 * two-channel set-ups; the shop's own are kept in this browser per shop (see the README: a shop-wide
 * list on the server is future work).
 */
import type { CaptureMetadataInput } from '../../../../shared/schemas/captures';

/** A named starting point for an upload's metadata. */
export interface CapturePreset {
  id: string;
  name: string;
  metadata: Pick<CaptureMetadataInput, 'channels' | 'reference' | 'sensorKind'>;
  builtIn?: boolean;
}

export const BUILT_IN_PRESETS: CapturePreset[] = [
  {
    id: 'coil-accel', name: 'Coil pickup (cyl. 1) on ch 1, accelerometer 100 mV/g on ch 2', builtIn: true,
    metadata: {
      channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 10, unit: 'g' }],
      reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null }, sensorKind: 'accelerometer',
    },
  },
  {
    id: 'coil-contact', name: 'Coil pickup (cyl. 1) on ch 1, contact pickup (volts) on ch 2', builtIn: true,
    metadata: {
      channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 1, unit: 'V' }],
      reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null }, sensorKind: 'piezo_contact',
    },
  },
  {
    id: 'wasted-accel', name: 'Wasted-spark pickup (1 per rev) on ch 1, accelerometer 100 mV/g on ch 2', builtIn: true,
    metadata: {
      channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 10, unit: 'g' }],
      reference: { kind: 'per-rev', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null }, sensorKind: 'accelerometer',
    },
  },
];

const storageKey = (shopId: number) => `crankwise.capture-presets.${shopId}`;

/** The shop's own presets saved in this browser. */
export function loadShopPresets(shopId: number): CapturePreset[] {
  try {
    const raw = localStorage.getItem(storageKey(shopId));
    const list = raw ? (JSON.parse(raw) as CapturePreset[]) : [];
    return Array.isArray(list) ? list.filter((p) => p && typeof p.name === 'string' && p.metadata) : [];
  } catch {
    return [];
  }
}

/** Saves one more preset for the shop (same name replaces). */
export function saveShopPreset(shopId: number, preset: Omit<CapturePreset, 'id'>): CapturePreset[] {
  const list = loadShopPresets(shopId).filter((p) => p.name !== preset.name);
  list.push({ ...preset, id: `shop-${Date.now()}` });
  localStorage.setItem(storageKey(shopId), JSON.stringify(list));
  return list;
}
