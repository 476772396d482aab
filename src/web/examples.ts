/** The example designs shipped with Furrow (src/design/examples), for the page's example menu. */
import blazed from '../design/examples/blazed-aluminium-spectrometer.json' with { type: 'json' };
import compressor from '../design/examples/silica-compressor-transmission.json' with { type: 'json' };
import plasmon from '../design/examples/gold-sinusoid-plasmon.json' with { type: 'json' };
import lamellar from '../design/examples/gold-lamellar.json' with { type: 'json' };

export interface Example {
  readonly id: string;
  readonly label: string;
  readonly design: unknown;
}

export const EXAMPLES: ReadonlyArray<Example> = [
  { id: 'blazed-aluminium-spectrometer', label: 'Blazed aluminium, 600 l/mm (visible spectrometer)', design: blazed },
  { id: 'silica-compressor-transmission', label: 'Fused-silica binary, 1600 l/mm (1030 nm compressor)', design: compressor },
  { id: 'gold-sinusoid-plasmon', label: 'Gold sinusoid, 1800 l/mm (plasmon dip)', design: plasmon },
  { id: 'gold-lamellar', label: 'Gold lamellar, 1200 l/mm (raw layers)', design: lamellar },
];

/** The design the page opens with when nothing else is given. */
export const DEFAULT_EXAMPLE = EXAMPLES[0]!;
