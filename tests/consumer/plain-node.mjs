// A consumer script run with plain `node` (no TypeScript loader): imports the package by its name
// (package self-reference through "exports" -> dist/src/index.js), loads and fits the demo stirred
// tank, and prints one JSON line. Run by tests/consumer/consumer.test.ts.
import { fitStudy, loadStudy, VERSION } from 'rateloom';

const study = loadStudy(process.argv[2]);
const { fit } = fitStudy(study);
console.log(JSON.stringify({ version: VERSION, status: fit.status, success: fit.success, parameters: fit.parameters.map((p) => p.name) }));
