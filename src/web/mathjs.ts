/**
 * The page and its workers hand mathjs to the engine (a browser cannot load it synchronously on
 * first use, as Node does; see structure/mathjs-access.ts). Imported for its effect, first.
 */
import * as math from 'mathjs';
import { provideMathjs } from '../structure/mathjs-access.ts';

provideMathjs(math);
