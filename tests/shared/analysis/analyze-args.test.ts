import { describe, expect, it } from 'vitest';
import { parseAnalyzeArgs, UsageError } from '../../../server/cli/analyze-args';

describe('analyze flags with negative values', () => {
  it('takes "--tdc-offset-deg -30" (TDC before the reference edge) and an inverting channel scale', () => {
    const a = parseAnalyzeArgs(['capture.wav', '--tdc-offset-deg', '-30', '--channel-scales', '-1,2.5', '--json']);
    expect(a.capture).toBe('capture.wav');
    expect(a.settings.tdcOffsetDeg).toBe(-30);
    expect(a.settings.channelScales).toEqual([-1, 2.5]);
    expect(a.json).toBe(true);
    expect(parseAnalyzeArgs(['--tdc-offset-deg', '-.5', 'x.csv']).settings.tdcOffsetDeg).toBe(-0.5);
    expect(parseAnalyzeArgs(['--tdc-offset-deg=-90', 'x.csv']).settings.tdcOffsetDeg).toBe(-90);
  });

  it('still refuses a flag given in place of a value, and a stray negative number', () => {
    expect(() => parseAnalyzeArgs(['x.wav', '--tdc-offset-deg', '--json'])).toThrow(UsageError);
    expect(() => parseAnalyzeArgs(['x.wav', '-30'])).toThrow(UsageError);
  });
});
