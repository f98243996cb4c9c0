import { enumerateWirings } from '../../src/wiring/index.js';
import { heading, line, medianMs } from './timing.js';

export function benchEnumerate(): void {
  heading('Enumerating wirings (canonical networks, text and descriptions)');
  for (const n of [3, 4, 5]) {
    const elements = Array.from({ length: n }, (_, index) => ({ id: `coil${index + 1}` }));
    let count = 0;
    const ms = medianMs(() => {
      count = enumerateWirings(elements).length;
    });
    line(`${n} coils: ${count} wirings`, `${ms.toFixed(1)} ms`);
  }
}
