/**
 * Run by the build: validates a rule folder in full and writes the seal of its files (see
 * src/knowledge/rule-seal.ts). An invalid folder gets no seal, so nothing unproved is trusted.
 * Usage: write-rule-seal RULES_DIR OUT_FILE
 */
import { writeFileSync } from 'node:fs';
import { sealRuleFolder } from '../src/knowledge/load-rules.js';
import { formatIssues } from '../src/knowledge/result.js';
import { sealToJson } from '../src/knowledge/rule-seal.js';

const [dir, outFile] = process.argv.slice(2);
if (!dir || !outFile) {
  process.stderr.write('usage: write-rule-seal RULES_DIR OUT_FILE\n');
  process.exit(2);
}
const sealed = sealRuleFolder(dir);
if (!sealed.ok) {
  process.stderr.write(`the rule folder does not load, so it is not sealed and will be validated on every run:\n${formatIssues(sealed.issues)}\n`);
  process.exit(1);
}
writeFileSync(outFile, sealToJson(sealed.value));
