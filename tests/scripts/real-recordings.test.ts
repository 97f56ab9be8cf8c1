import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readTruth, scoreRecording, summarise, type TruthRow } from '../../scripts/real-recordings';
import { parseDriveDocument } from '../../shared/schemas/drive';

// The scorer behind `npm run accuracy -- --data DIR`, run on the published CWRU records 105 (inner
// race) and 130 (outer race) of tests/fixtures/open-data/ (Case Western Reserve University Bearing
// Data Center; README there), described as rows of the open-data kit's cwru-dev truth format.
const dir = fileURLToPath(new URL('../fixtures/open-data/', import.meta.url));
const rig = parseDriveDocument(JSON.parse(readFileSync(new URL('../shared/drive/fixtures/test-rig.drive.json', import.meta.url), 'utf8')));
const kit = JSON.parse(readFileSync(join(dir, 'cwru.json'), 'utf8')) as Record<string, { rpm: number; component: string; fault: TruthRow['fault']; order: number }>;
const rows: TruthRow[] = Object.entries(kit).map(([file, t]) => ({ file, rpm: t.rpm, sampleRateHz: 12000, component: t.component, fault: t.fault, order: t.order }));

describe('scoring real recordings against a cwru-dev truth file', () => {
  it('ranks the faulty drive-end bearing with its fault first in both published records, with a clear margin', async () => {
    const verdicts = [];
    for (const row of rows) {
      const v = await scoreRecording(dir, row, rig);
      expect(v.ok, `${row.file}: first ${JSON.stringify(v.first)}`).toBe(true);
      // The runner-up (the fan-end 6203's patterns on whole shaft orders, before the shaft-multiple
      // term) stays well below the true pattern.
      expect(v.ranking[1].score).toBeLessThan(0.6 * v.ranking[0].score);
      verdicts.push(v);
    }
    const table = summarise(verdicts).join('\n');
    expect(table).toMatch(/inner race \| 1 \| 1\/1/);
    expect(table).toMatch(/all faulty \| 2 \| 2\/2/);
  }, 60_000);

  it('refuses a truth file with a bad row, naming the row and field', () => {
    const tmp = mkdtempSync(join(tmpdir(), 'crankwise-truth-'));
    const path = join(tmp, 'truth.json');
    writeFileSync(path, JSON.stringify([{ file: 'a.wav', component: 'Drive-end bearing', fault: 'spalled' }]));
    expect(() => readTruth(path)).toThrow(/row 0 field fault/);
    writeFileSync(path, JSON.stringify([{ file: 'a.wav', component: null, fault: null }]));
    expect(readTruth(path)).toHaveLength(1);
  });

  it('says which listed recording is missing', async () => {
    await expect(scoreRecording(dir, { file: 'no-such.wav', component: null, fault: null }, rig)).rejects.toThrow(/listed in the truth file but missing/);
  });
});
