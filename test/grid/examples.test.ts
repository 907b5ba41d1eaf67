/** Every `@example` in src/grid is true (see test/support/examples.ts). */
import { join } from 'node:path';
import * as gridModule from '../../src/grid/index.js';
import { describeExamples } from '../support/examples.js';

describeExamples('TSDoc examples in src/grid', join(import.meta.dirname, '../../src/grid'), gridModule, 36);
