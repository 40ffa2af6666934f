// Writes src/plan/generated/planSchema.ts from the built plan schema. Run: npm run gen:validator
import { mkdirSync, writeFileSync } from 'node:fs';
import { planJsonSchema } from '../dist/plan/schema.js';
import { assertSupportedSchema } from '../dist/plan/conforms.js';
import { planSchemaSource, validityOnly } from './plan-validator-source.mjs';

assertSupportedSchema(validityOnly(planJsonSchema()));
const out = new URL('../src/plan/generated/planSchema.ts', import.meta.url);
mkdirSync(new URL('.', out), { recursive: true });
writeFileSync(out, planSchemaSource(planJsonSchema()));
console.log(`wrote ${out.pathname}`);
