// Writes src/plan/generated/planCheck.ts from the built plan schema. Run: npm run gen:validator
import { writeFileSync } from 'node:fs';
import { planJsonSchema } from '../dist/plan/schema.js';
import { planCheckSource } from './plan-validator-source.mjs';

const out = new URL('../src/plan/generated/planCheck.ts', import.meta.url);
writeFileSync(out, planCheckSource(planJsonSchema()));
console.log(`wrote ${out.pathname}`);
