import { compile } from 'json-schema-to-typescript';
import { readFileSync } from 'node:fs';
const s = JSON.parse(readFileSync('configs/schema.json','utf8'));
delete s.$id;
console.log(await compile(s, 'ExperimentFile', { bannerComment: '', additionalProperties: false, unknownAny: true, format: false, strictIndexSignatures: true }));
