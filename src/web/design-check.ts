/**
 * Checking the design text the way the CLI does (parseDesignModel, then problemAt at the design's
 * wavelength) and turning each failure into the CLI's message, plus a per-field map so the form
 * can show the message next to the field it names.
 */
import { InputError, parseDesignModel, problemAt, type DesignModel, type Problem, type ReadText } from '../design/index.ts';
import { MaterialError } from '../materials/index.ts';
import { SolverError } from '../solver/index.ts';

export interface DesignCheck {
  /** the parsed JSON object, when the text is JSON */
  readonly raw: unknown;
  readonly model: DesignModel | null;
  readonly problem: Problem | null;
  /** the message the CLI prints after "furrow: ", or null when the design is valid */
  readonly message: string | null;
  /** field path (as the message names it) → that field's message */
  readonly fieldErrors: ReadonlyMap<string, string>;
}

/** "  - grating.duty: expected …" lines of a schema failure, by path. */
function schemaLines(message: string): Map<string, string> {
  const m = new Map<string, string>();
  for (const line of message.split('\n')) {
    const hit = /^\s+- ([^:]+): (.*)$/.exec(line);
    if (hit) m.set(hit[1]!, `${hit[1]}: ${hit[2]}`);
  }
  return m;
}

/**
 * Validate design text.
 * @param source the name used in a JSON syntax error (the CLI uses the file's path)
 * @param readText reads the material tables the design names
 */
export function checkDesign(text: string, source = 'design', readText?: ReadText): DesignCheck {
  let raw: unknown = null;
  try {
    raw = JSON.parse(text);
  } catch {
    raw = null;
  }
  let model: DesignModel | null = null;
  try {
    model = parseDesignModel(text, source, readText);
    const problem = problemAt(model);
    return { raw, model, problem, message: null, fieldErrors: new Map() };
  } catch (e) {
    let message: string;
    let fields = new Map<string, string>();
    if (e instanceof InputError) {
      message = `invalid design — ${e.message}`;
      fields = e.path === 'design' ? schemaLines(e.message) : new Map([[e.path, e.message]]);
    } else if (e instanceof MaterialError) {
      message = e.message;
    } else if (e instanceof SolverError) {
      message = `${e.code === 'invalid-input' ? 'invalid input — ' : ''}${e.message}`;
    } else {
      message = `unexpected failure: ${e instanceof Error ? e.message : String(e)}`;
    }
    return { raw, model, problem: null, message, fieldErrors: fields };
  }
}
