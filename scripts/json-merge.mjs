#!/usr/bin/env node
// A git merge driver for messages/*.json: a deep merge of two branches' catalogues, so
// two pieces of work that each add their own keys merge without a conflict. A key that
// both sides changed to different texts is a real conflict: the driver fails and names it.
// Set up once per clone:  git config merge.ecotone-json.driver "node scripts/json-merge.mjs %O %A %B"
import { readFileSync, writeFileSync } from "node:fs";

const [basePath, oursPath, theirsPath] = process.argv.slice(2);
const read = (p) => {
  try {
    return JSON.parse(readFileSync(p, "utf8"));
  } catch {
    return {};
  }
};
const base = read(basePath),
  ours = read(oursPath),
  theirs = read(theirsPath);
const conflicts = [];

function merge(b, o, t, at) {
  const out = { ...o };
  for (const [k, tv] of Object.entries(t)) {
    const ov = o[k],
      bv = b?.[k];
    if (ov === undefined) {
      if (JSON.stringify(bv) !== JSON.stringify(tv) || bv === undefined) out[k] = tv;
      continue;
    }
    if (typeof ov === "object" && typeof tv === "object") {
      out[k] = merge(bv ?? {}, ov, tv, `${at}${k}.`);
      continue;
    }
    if (JSON.stringify(ov) === JSON.stringify(tv)) continue;
    if (JSON.stringify(ov) === JSON.stringify(bv))
      out[k] = tv; // only theirs changed it
    else if (JSON.stringify(tv) !== JSON.stringify(bv)) conflicts.push(`${at}${k}`);
  }
  // A key one side deleted and the other left as it was in the base is deleted.
  for (const [k, ov] of Object.entries(o)) {
    if (k in t || b?.[k] === undefined) continue;
    if (JSON.stringify(ov) === JSON.stringify(b[k])) delete out[k];
    else conflicts.push(`${at}${k}`);
  }
  return out;
}

const merged = merge(base, ours, theirs, "");
writeFileSync(oursPath, JSON.stringify(merged, null, 2) + "\n");
if (conflicts.length) {
  console.error(`messages conflict at: ${conflicts.join(", ")}`);
  process.exit(1);
}
