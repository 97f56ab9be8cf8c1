/**
 * The demo shop's three engines as drive documents — invented demo values, not any maker's data.
 * Diameters are effective (pitch-line) diameters chosen to give plausible ratios
 * (docs/references.md §5, common practice): alternators 2–3.5, pumps about 1–1.3, A/C compressors
 * 1.1–1.5. Bearings are by designation (the published rows of docs/references.md §1 that every shop's
 * table is seeded with) or by invented geometry; idlers and tensioners turn the outer ring.
 * Pure data: the seeding itself lives in drive-library.ts, so tests can import these documents.
 */
import type { DriveDocument } from '../../../shared/drive/types';

/** Said in each engine's notes so nobody mistakes the figures for a real engine's. */
export const DEMO_ENGINE_NOTE = 'Invented demo values: not taken from any real engine.';

/** A four-cylinder petrol engine with one serpentine belt and a backside idler. */
export const DEMO_I4: DriveDocument = {
  name: 'Demo 1.6 I4 petrol',
  cylinders: 4,
  firingOrder: [1, 3, 4, 2],
  idleRpm: 760,
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    // 148 / 56 = 2.643
    { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56,
      bearing: { balls: 8, ballMm: 6.747, pitchMm: 28.5, contactDeg: 0, rotatingRing: 'inner' } },
    // 148 / 134 = 1.104 and 148 / 131 = 1.130: two parts of near-equal ratio
    { name: 'Water pump', kind: 'water_pump', belt: 'Main', pulleyMm: 134,
      bearing: { balls: 10, ballMm: 7.144, pitchMm: 36.0, contactDeg: 0, rotatingRing: 'inner' } },
    { name: 'Power steering pump', kind: 'power_steering', belt: 'Main', pulleyMm: 131,
      bearing: { designation: '6205', rotatingRing: 'inner' } },
    // 148 / 112 = 1.321
    { name: 'A/C compressor', kind: 'ac_compressor', belt: 'Main', pulleyMm: 112,
      bearing: { balls: 12, ballMm: 6.35, pitchMm: 46.0, contactDeg: 25, rotatingRing: 'outer' } },
    { name: 'Upper idler', kind: 'idler', belt: 'Main', pulleyMm: 70, backside: true,
      bearing: { designation: '6203', rotatingRing: 'outer' } },
    { name: 'Tensioner', kind: 'tensioner', belt: 'Main', pulleyMm: 65,
      bearing: { designation: '6203', rotatingRing: 'outer' } },
  ],
};

/** A V6 whose crank has a second groove driving a short belt to the A/C compressor. */
export const DEMO_V6: DriveDocument = {
  name: 'Demo 3.0 V6 petrol',
  cylinders: 6,
  firingOrder: [1, 2, 3, 4, 5, 6],
  idleRpm: 680,
  belts: [
    { name: 'Front', lengthMm: 1820, driver: 'Crankshaft', driverPulleyMm: 162 },
    { name: 'A/C belt', lengthMm: 960, driver: 'Crankshaft', driverPulleyMm: 150 },
  ],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    // 162 / 60 = 2.700
    { name: 'Alternator', kind: 'alternator', belt: 'Front', pulleyMm: 60,
      bearing: { designation: '6203', rotatingRing: 'inner' } },
    // 162 / 142 = 1.141
    { name: 'Power steering pump', kind: 'power_steering', belt: 'Front', pulleyMm: 142,
      bearing: { balls: 9, ballMm: 7.938, pitchMm: 39.04, contactDeg: 0, rotatingRing: 'inner' } },
    // 162 / 150 = 1.080
    { name: 'Water pump', kind: 'water_pump', belt: 'Front', pulleyMm: 150,
      bearing: { balls: 11, ballMm: 6.35, pitchMm: 38.5, contactDeg: 0, rotatingRing: 'inner' } },
    { name: 'Backside idler', kind: 'idler', belt: 'Front', pulleyMm: 76, backside: true,
      bearing: { designation: '6205', rotatingRing: 'outer' } },
    { name: 'Tensioner', kind: 'tensioner', belt: 'Front', pulleyMm: 70,
      bearing: { designation: '6203', rotatingRing: 'outer' } },
    // Second belt: 150 / 118 = 1.271
    { name: 'A/C compressor', kind: 'ac_compressor', belt: 'A/C belt', pulleyMm: 118,
      bearing: { balls: 13, ballMm: 6.0, pitchMm: 50.0, contactDeg: 20, rotatingRing: 'outer' } },
    { name: 'A/C idler', kind: 'idler', belt: 'A/C belt', pulleyMm: 66,
      bearing: { balls: 7, ballMm: 7.5, pitchMm: 33.0, contactDeg: 0, rotatingRing: 'outer' } },
  ],
};

/** A diesel four-cylinder with a decoupler alternator pulley and a cam-driven vacuum pump. */
export const DEMO_DIESEL_I4: DriveDocument = {
  name: 'Demo 2.0 I4 diesel',
  cylinders: 4,
  firingOrder: [1, 3, 4, 2],
  idleRpm: 820,
  belts: [{ name: 'Accessory', lengthMm: 1650, driver: 'Crankshaft', driverPulleyMm: 172 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    // 172 / 54 = 3.185, on an overrunning (decoupler) pulley
    { name: 'Alternator', kind: 'alternator', belt: 'Accessory', pulleyMm: 54, overrunning: true,
      bearing: { balls: 8, ballMm: 6.35, pitchMm: 27.0, contactDeg: 0, rotatingRing: 'inner' } },
    // 172 / 150 = 1.147
    { name: 'Water pump', kind: 'water_pump', belt: 'Accessory', pulleyMm: 150,
      bearing: { designation: '6205', rotatingRing: 'inner' } },
    // 172 / 128 = 1.344
    { name: 'A/C compressor', kind: 'ac_compressor', belt: 'Accessory', pulleyMm: 128,
      bearing: { balls: 12, ballMm: 6.747, pitchMm: 48.0, contactDeg: 25, rotatingRing: 'outer' } },
    { name: 'Backside idler', kind: 'idler', belt: 'Accessory', pulleyMm: 72, backside: true,
      bearing: { designation: '6203', rotatingRing: 'outer' } },
    { name: 'Tensioner', kind: 'tensioner', belt: 'Accessory', pulleyMm: 68,
      bearing: { balls: 8, ballMm: 7.144, pitchMm: 31.0, contactDeg: 0, rotatingRing: 'outer' } },
    // Driven from the camshaft: half crank speed, no belt, no slip.
    { name: 'Vacuum pump', kind: 'vacuum_pump', fixedRatio: 0.5,
      bearing: { balls: 7, ballMm: 5.556, pitchMm: 24.0, contactDeg: 0, rotatingRing: 'inner' } },
  ],
};

/** The three demo engines, in the order they are seeded. */
export const DEMO_ENGINES: readonly DriveDocument[] = [DEMO_I4, DEMO_V6, DEMO_DIESEL_I4];
