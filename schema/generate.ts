/**
 * Writes schema/study.schema.json from the study validator: `npm run schema`.
 * tests/io/studySchema.test.ts fails when the committed file differs from what this writes.
 */
import { writeFileSync } from 'node:fs';
import { studySchemaPath, studySchemaText } from '../src/io/studySchemaFile.js';

writeFileSync(studySchemaPath(), studySchemaText());
process.stdout.write(`wrote ${studySchemaPath()}\n`);
