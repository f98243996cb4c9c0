/**
 * Strings and coil spectra of the demo guitar playing `strum`, the
 * reference phrase: the work done once per render, before any wiring.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseGuitarText } from '../../src/guitar/index.js';
import { nextPowerOfTwo, realFft } from '../../src/math/index.js';
import { computeCoilSpectra } from '../../src/pickup/index.js';
import { type StringRender, builtInPhrase, renderPhrase } from '../../src/string/index.js';
import { heading, line, medianMs } from './timing.js';

export function benchStrings(): void {
  const guitar = parseGuitarText(readFileSync(join(import.meta.dirname, '..', '..', 'samples', 'three-single-coil.json'), 'utf8'));
  heading('Strings and coil spectra (demo guitar, phrase strum)');
  for (const name of ['strum', 'riff', 'open-strings'] as const) {
    let render: StringRender | undefined;
    const ms = medianMs(() => {
      render = renderPhrase(guitar, builtInPhrase(name));
    });
    const seconds = (render?.length ?? 0) / (render?.sampleRateHz ?? 1);
    line(`${name}: ${guitar.strings.length} strings, ${seconds.toFixed(2)} s of audio`, `${ms.toFixed(1)} ms (${(seconds / (ms / 1000)).toFixed(0)}× real time)`);
  }
  // Stiffness costs the dispersion cascade's sections per sample (docs/physics.md §4.5): a ratio in this process.
  const stiffMs = medianMs(() => renderPhrase(guitar, builtInPhrase('strum')));
  const flexibleMs = medianMs(() => renderPhrase(guitar, builtInPhrase('strum'), { inharmonicity: 0 }));
  line('strum: stiff strings (the default) against flexible (B = 0)', `${(stiffMs / flexibleMs).toFixed(2)}× (${stiffMs.toFixed(1)} against ${flexibleMs.toFixed(1)} ms)`);
  const strum = renderPhrase(guitar, builtInPhrase('strum'));
  const size = nextPowerOfTwo(strum.length);
  const spectraMs = medianMs(() => computeCoilSpectra(guitar, strum, size));
  line(`coil spectra: ${guitar.coils.length} coils × ${strum.waves.length} strings, FFT ${size}`, `${spectraMs.toFixed(1)} ms`);
  const spectrum = computeCoilSpectra(guitar, strum, size)[0] ?? new Float64Array(size + 2);
  const out = new Float64Array(size);
  const inverseMs = medianMs(() => realFft(size).inverse(spectrum, out));
  line(`for scale: one inverse FFT of ${size} (each wiring needs one)`, `${inverseMs.toFixed(2)} ms`);
}
