/** The built-in demo design (an invented example, not a product). */
import { designToProblem, type Problem } from '../design/index.ts';
import example from '../design/examples/blazed-aluminium-spectrometer.json' with { type: 'json' };

export function demoDesign(): Problem {
  return designToProblem(example);
}

/** The demo design as its raw JSON object. */
export function demoDesignRaw(): unknown {
  return example;
}
