import { useEffect, useMemo, useRef, useState } from 'react';
import { spectrogramCsvRows, spectrogramOption, spectrogramPixels, type SpectrogramData } from '../../../../shared/plots/spectrogram-option';
import { PlotCard } from '../../../components/charts/plot-card';

const HEIGHT = 420;

/** Draws the spectrogram's pixels once into a canvas and returns it as a PNG data URL. */
function useSpectrogramImage(s: SpectrogramData): string | null {
  return useMemo(() => {
    if (s.frames < 1 || s.bins < 1 || typeof document === 'undefined') return null;
    const canvas = document.createElement('canvas');
    canvas.width = s.frames;
    canvas.height = s.bins;
    const ctx = canvas.getContext('2d');
    if (!ctx) return null;
    ctx.putImageData(new ImageData(new Uint8ClampedArray(spectrogramPixels(s)), s.frames, s.bins), 0, 0);
    return canvas.toDataURL('image/png');
  }, [s]);
}

/** Spectrogram: frequency against time (60 dB of colour) with the rpm trace over it. */
export function SpectrogramPlot({ data, fileName }: { data: SpectrogramData; fileName: string }) {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(960);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const observer = new ResizeObserver(() => setWidth(el.clientWidth || 960));
    observer.observe(el);
    setWidth(el.clientWidth || 960);
    return () => observer.disconnect();
  }, []);
  const image = useSpectrogramImage(data);
  const option = useMemo(() => spectrogramOption(data, image, { width, height: HEIGHT }), [data, image, width]);
  return (
    <div ref={box}>
      <PlotCard
        title="Spectrogram"
        description="Frequency against time, louder in brighter colours (60 dB range), with the rpm trace over it: lines that follow the rpm come from the engine or the drive."
        option={option}
        height={HEIGHT}
        fileName={fileName}
        csv={() => spectrogramCsvRows(data)}
      />
    </div>
  );
}
