/**
 * Mutations of valid files, as damaged files arrive in practice: bit flips, runs of overwritten
 * bytes, truncation, inserted and deleted bytes, huge declared sizes (binary); and, for JSON,
 * values replaced by the wrong type, removed keys and huge numbers. Deterministic from a seed.
 */

import { prng } from '../fixtures/demo-margin.js';

export { prng };

export type Rand = () => number;
const int = (r: Rand, n: number) => Math.floor(r() * n);
const pick = <T>(r: Rand, xs: readonly T[]): T => xs[int(r, xs.length)];

const HUGE = [0xffffffff, 0x7fffffff, 0x80000000, 0x10000000, 200_000_000, 65535, 0];

/** One binary mutation; `structureEnd` biases edits towards the header and directory. */
export function mutateBytes(src: Uint8Array, r: Rand, structureEnd = Math.min(src.length, 1024)): { bytes: Uint8Array; how: string } {
  const b = src.slice();
  const near = () => Math.min(b.length, r() < 0.7 ? int(r, Math.max(1, structureEnd)) : int(r, Math.max(1, b.length)));
  const kind = int(r, 7);
  switch (kind) {
    case 0: {
      const n = 1 + int(r, 8);
      for (let k = 0; k < n; k++) b[near()] ^= 1 << int(r, 8);
      return { bytes: b, how: `flip ${n} bits` };
    }
    case 1: {
      const at = near();
      const len = 1 + int(r, 64);
      const v = pick(r, [0, 0xff, int(r, 256)]);
      b.fill(v, at, at + len);
      return { bytes: b, how: `run of ${len} × ${v} at ${at}` };
    }
    case 2: {
      const len = int(r, b.length);
      return { bytes: b.subarray(0, len), how: `truncated to ${len}` };
    }
    case 3: {
      const at = near();
      const ins = Uint8Array.from({ length: 1 + int(r, 32) }, () => int(r, 256));
      const out = new Uint8Array(b.length + ins.length);
      out.set(b.subarray(0, at));
      out.set(ins, at);
      out.set(b.subarray(at), at + ins.length);
      return { bytes: out, how: `${ins.length} bytes inserted at ${at}` };
    }
    case 4: {
      const at = near();
      const end = Math.min(b.length, at + 1 + int(r, 32));
      const out = new Uint8Array(b.length - (end - at));
      out.set(b.subarray(0, at));
      out.set(b.subarray(end), at);
      return { bytes: out, how: `${end - at} bytes deleted at ${at}` };
    }
    case 5: {
      // a huge or zero declared size/offset/count, 2- or 4-byte aligned, either byte order
      const n = 1 + int(r, 3);
      for (let k = 0; k < n; k++) {
        const at = near() & ~1;
        const v = pick(r, HUGE);
        const little = r() < 0.5;
        if (r() < 0.5 && at + 2 <= b.length) new DataView(b.buffer, b.byteOffset).setUint16(at, v & 0xffff, little);
        else if (at + 4 <= b.length) new DataView(b.buffer, b.byteOffset).setUint32(at, v >>> 0, little);
      }
      return { bytes: b, how: `${n} declared values set huge or zero` };
    }
    default: {
      // several mutations at once
      let out: { bytes: Uint8Array; how: string } = { bytes: b, how: "mixed:" };
      for (let k = 0; k < 2 + int(r, 3); k++) {
        const m = mutateBytes(out.bytes, r, structureEnd);
        out = { bytes: m.bytes, how: `${out.how} ${m.how};` };
      }
      return out;
    }
  }
}

const WRONG: readonly unknown[] = [null, 'text', '0x8000', '', 0, -1, 1e308, -1e308, 3.5, true, [], [1, 2], {}, { a: 1 }, 'nope', 2 ** 31, 'NaN'];

/** One structural JSON mutation: a value of the wrong type, a removed key, or emptied lists. */
export function mutateJson(src: unknown, r: Rand): { value: unknown; how: string } {
  const root = structuredClone(src);
  const nodes: { parent: Record<string, unknown> | unknown[]; key: string | number; path: string }[] = [];
  const walk = (v: unknown, path: string) => {
    if (Array.isArray(v)) v.forEach((x, k) => (nodes.push({ parent: v, key: k, path: `${path}[${k}]` }), walk(x, `${path}[${k}]`)));
    else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) nodes.push({ parent: v as Record<string, unknown>, key: k, path: `${path}.${k}` }), walk(x, `${path}.${k}`);
  };
  walk(root, '');
  if (!nodes.length) return { value: pick(r, WRONG), how: 'root replaced' };
  const n = 1 + int(r, 3);
  const hows: string[] = [];
  for (let k = 0; k < n; k++) {
    const node = pick(r, nodes);
    const p = node.parent as Record<string | number, unknown>;
    const what = int(r, 5);
    if (what === 0 && !Array.isArray(node.parent)) {
      delete p[node.key];
      hows.push(`${node.path} removed`);
    } else if (what === 1 && typeof p[node.key] === 'number') {
      p[node.key] = (p[node.key] as number) * pick(r, [1e6, -1, 1e-9, 1e300]);
      hows.push(`${node.path} scaled`);
    } else if (what === 2 && Array.isArray(p[node.key])) {
      p[node.key] = pick(r, [[], [null], [[]], (p[node.key] as unknown[]).slice(0, 1)]);
      hows.push(`${node.path} list cut`);
    } else {
      p[node.key] = structuredClone(pick(r, WRONG));
      hows.push(`${node.path} = ${JSON.stringify(p[node.key])}`);
    }
  }
  return { value: root, how: hows.join('; ') };
}

/** Text mutation for XYZ: numbers replaced by other spellings, huge values, stray points, or byte damage. */
export function mutateText(src: string, r: Rand): { text: string; how: string } {
  const lines = src.split('\n');
  const kind = int(r, 5);
  const at = int(r, lines.length);
  if (kind === 0) {
    const parts = lines[at].split(/(\s+|,)/);
    const k = int(r, parts.length);
    parts[k] = pick(r, ['0x1F', 'Infinity', '-inf', '1e400', 'nan', '', '1,5', '١٢٣', '9'.repeat(400), '1e-320']);
    lines[at] = parts.join('');
    return { text: lines.join('\n'), how: `line ${at + 1} field ${k} respelt` };
  }
  if (kind === 1) {
    lines.push(`${pick(r, ['1', '-1e7', '1e9', '0.001'])} ${pick(r, ['5', '1e8', '-3e6', '0.5'])} 100`);
    return { text: lines.join('\n'), how: 'stray point appended' };
  }
  if (kind === 2) {
    const n = 1 + int(r, 20);
    lines.splice(at, n);
    return { text: lines.join('\n'), how: `${n} lines removed at ${at + 1}` };
  }
  if (kind === 3) {
    lines.splice(at, 0, ...Array.from({ length: 1 + int(r, 5) }, () => pick(r, ['x y z', '# comment', '', '\r', '1 2', '1 2 3 4 5', '\u0000\u0000'])));
    return { text: lines.join('\n'), how: `lines inserted at ${at + 1}` };
  }
  const m = mutateBytes(new TextEncoder().encode(src), r, src.length);
  return { text: new TextDecoder().decode(m.bytes), how: m.how };
}
