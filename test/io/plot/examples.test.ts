/** Every `@example` in src/io/plot is true, run against the package's public exports (see test/support/examples.ts). */
import { join } from 'node:path';
import * as library from '../../../src/index.js';
import { describeExamples } from '../../support/examples.js';

describeExamples('TSDoc examples in src/io/plot', join(import.meta.dirname, '../../../src/io/plot'), library, 18);
