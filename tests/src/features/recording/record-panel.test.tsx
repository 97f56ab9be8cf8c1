import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { buildRecordingMetadata } from '../../../../src/features/recording/lib/recording-metadata';
import { channelLevels, joinBlocks } from '../../../../src/features/recording/lib/levels';
import { makeUser } from '../../helpers/factories';
import { renderApp } from '../../helpers/render-app';

describe('record page', () => {
  it('says where the Record button would be that the page is not secure, and why (jsdom is not a secure context)', async () => {
    renderApp('/cases/7/record', { user: makeUser({ role: 'tech' }) });
    expect(await screen.findByText('Recording needs a secure page', {}, { timeout: 5000 })).toBeTruthy();
    expect(screen.getByText(/TLS_CERT_FILE and TLS_KEY_FILE or an HTTPS reverse proxy/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Connect input' })).toBeNull();
    // The cautions are shown before recording.
    expect(screen.getByText('Before you record at a running engine')).toBeTruthy();
  });
});

describe('recording metadata and levels', () => {
  it('two channels with a clamp: reference on 1, contact pickup on 2, source recording', () => {
    const m = buildRecordingMetadata({ channels: 2, reference: 'cyl1', probe: 'alternator housing' });
    expect(m.channels.map((c) => c.role)).toEqual(['reference', 'pickup']);
    expect(m.reference?.kind).toBe('cyl1');
    expect(m.sensorKind).toBe('piezo_contact');
    expect(m.source).toBe('recording');
  });

  it('one channel is airborne sound from a microphone with no reference', () => {
    const m = buildRecordingMetadata({ channels: 1, reference: 'cyl1', probe: 'near the belt' });
    expect(m.channels.map((c) => c.role)).toEqual(['pickup']);
    expect(m.reference).toBeNull();
    expect(m.sensorKind).toBe('microphone');
  });

  it('two channels without a clamp keep the pickup on input 2', () => {
    const m = buildRecordingMetadata({ channels: 2, reference: null, probe: 'x' });
    expect(m.channels.map((c) => c.role)).toEqual(['unused', 'pickup']);
    expect(m.reference).toBeNull();
  });

  it('reads peak dBFS and clipping per channel from joined blocks', () => {
    const blocks = [[Float32Array.of(0.5, -0.25), Float32Array.of(0.1, 1)], [Float32Array.of(0.1, 0), Float32Array.of(-0.2, 0)]];
    const joined = joinBlocks(blocks, 2);
    expect(Array.from(joined[0])).toEqual([0.5, -0.25, 0.1, 0].map((v) => Math.fround(v)));
    const lv = channelLevels(joined);
    expect(lv[0].peakDbfs).toBeCloseTo(20 * Math.log10(0.5), 6);
    expect(lv[0].clipped).toBe(false);
    expect(lv[1].clipped).toBe(true);
  });
});
