import { describe, expect, it } from 'vitest';
import { FftPlanCache } from '../../../shared/dsp/fft';
import { spectralKurtosis } from '../../../shared/dsp/spectral-kurtosis';
import { gaussian, tone } from '../../helpers/signals';

// SK(f) = ⟨|X|⁴⟩/⟨|X|²⟩² − 2: ≈ 0 for Gaussian noise, −1 for a steady sinusoid, > 0 for
// impulsive content (J. Antoni, MSSP 20(2):282–307, 2006; docs/references.md §4 [derived]).
describe('spectral kurtosis (Antoni 2006)', () => {
  const opts = { frameSize: 256, hop: 128 };

  it('is about 0 for Gaussian noise', () => {
    const { sk } = spectralKurtosis(gaussian(400_000, 1), opts, new FftPlanCache());
    let m = 0;
    for (let k = 10; k < 118; k++) m += sk[k];
    expect(Math.abs(m / 108)).toBeLessThan(0.05);
  });

  it('is about −1 at a steady sinusoid', () => {
    const fs = 25_600;
    const { sk } = spectralKurtosis(tone(200_000, 2000, fs, 1), opts, new FftPlanCache());
    expect(sk[20]).toBeCloseTo(-1, 2);
  });

  it('is well above 0 where impacts ring', () => {
    const fs = 25_600;
    const n = 200_000;
    const noise = gaussian(n, 3);
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.05 * noise[i];
    for (let s = 100; s < n - 400; s += 1733) for (let j = 0; j < 300; j++) x[s + j] += Math.exp(-j / 40) * Math.sin((2 * Math.PI * 4000 * j) / fs);
    const { sk } = spectralKurtosis(x, opts, new FftPlanCache());
    expect(sk[40]).toBeGreaterThan(2);
  });
});
