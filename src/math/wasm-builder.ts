/**
 * A small writer of WebAssembly binary modules, enough for the numeric kernels in src/math/simd-kernels.ts:
 * functions over i32 / f64 / v128 values, one imported (optionally shared) linear memory, structured loops.
 * Encoding as in the WebAssembly Core Specification 2.0 (W3C, 2022), chapter 5 "Binary Format", and its
 * fixed-width SIMD instructions (opcode prefix 0xFD).
 */

export type ValueType = 'i32' | 'f64' | 'v128';
const TYPE_CODE: Record<ValueType, number> = { i32: 0x7f, f64: 0x7c, v128: 0x7b };

/** Plain opcodes (no immediates) by their text-format names. */
const PLAIN = {
  'i32.eqz': [0x45], 'i32.eq': [0x46], 'i32.ne': [0x47], 'i32.lt_s': [0x48], 'i32.lt_u': [0x49], 'i32.gt_s': [0x4a],
  'i32.le_s': [0x4c], 'i32.ge_s': [0x4e], 'i32.add': [0x6a], 'i32.sub': [0x6b], 'i32.mul': [0x6c], 'i32.and': [0x71],
  'i32.shl': [0x74], 'i32.shr_s': [0x75],
  'f64.add': [0xa0], 'f64.sub': [0xa1], 'f64.mul': [0xa2], 'f64.div': [0xa3],
  'f64x2.splat': simd(0x14), 'f64x2.add': simd(0xf0), 'f64x2.sub': simd(0xf1), 'f64x2.mul': simd(0xf2),
  drop: [0x1a], return: [0x0f],
} satisfies Record<string, number[]>;
export type PlainOp = keyof typeof PLAIN;

function simd(op: number): number[] {
  return [0xfd, ...unsignedLeb(op)];
}

function unsignedLeb(value: number): number[] {
  const out: number[] = [];
  let v = value >>> 0;
  do {
    let byte = v & 0x7f;
    v >>>= 7;
    if (v) byte |= 0x80;
    out.push(byte);
  } while (v);
  return out;
}

function signedLeb(value: number): number[] {
  const out: number[] = [];
  let v = value | 0;
  for (;;) {
    const byte = v & 0x7f;
    v >>= 7;
    if ((v === 0 && !(byte & 0x40)) || (v === -1 && byte & 0x40)) {
      out.push(byte);
      return out;
    }
    out.push(byte | 0x80);
  }
}

const name = (s: string) => [...unsignedLeb(s.length), ...[...s].map((c) => c.charCodeAt(0))];
const vector = (items: number[][]) => [...unsignedLeb(items.length), ...items.flat()];
const section = (id: number, bytes: number[]) => [id, ...unsignedLeb(bytes.length), ...bytes];

/** One function body, written instruction by instruction (every method returns the builder, for chaining). */
export class FunctionBuilder {
  readonly code: number[] = [];
  private readonly localTypes: ValueType[] = [];

  constructor(
    readonly name: string,
    readonly params: readonly ValueType[],
  ) {}

  /** Declare a local; returns its index (parameters come first). */
  local(type: ValueType): number {
    this.localTypes.push(type);
    return this.params.length + this.localTypes.length - 1;
  }

  get(index: number): this {
    return this.emit(0x20, ...unsignedLeb(index));
  }
  set(index: number): this {
    return this.emit(0x21, ...unsignedLeb(index));
  }
  tee(index: number): this {
    return this.emit(0x22, ...unsignedLeb(index));
  }
  i32(value: number): this {
    return this.emit(0x41, ...signedLeb(value));
  }
  f64(value: number): this {
    const bytes = new Uint8Array(new Float64Array([value]).buffer);
    return this.emit(0x44, ...bytes);
  }
  /** A plain instruction by its text-format name. */
  op(...names: PlainOp[]): this {
    for (const n of names) this.emit(...PLAIN[n]);
    return this;
  }
  /** f64.load / f64.store with a constant byte offset (address on the stack). */
  loadF64(offset = 0): this {
    return this.emit(0x2b, 3, ...unsignedLeb(offset));
  }
  storeF64(offset = 0): this {
    return this.emit(0x39, 3, ...unsignedLeb(offset));
  }
  /** v128.load / v128.store (alignment hint 8 bytes: addresses need only be 8-byte aligned). */
  loadV128(offset = 0): this {
    return this.emit(...simd(0x00), 3, ...unsignedLeb(offset));
  }
  storeV128(offset = 0): this {
    return this.emit(...simd(0x0b), 3, ...unsignedLeb(offset));
  }
  /** v128.load64_splat: one f64 from memory into both lanes (address on the stack). */
  loadSplatF64(offset = 0): this {
    return this.emit(...simd(0x0a), 3, ...unsignedLeb(offset));
  }
  extractLane(lane: 0 | 1): this {
    return this.emit(...simd(0x21), lane);
  }
  zeroV128(): this {
    return this.emit(...simd(0x0c), ...new Array(16).fill(0));
  }

  /**
   * `while (counter < limit) { body; counter += step }` on i32 locals (signed compare); `body` may use
   * `br(1)` to leave the loop.
   */
  whileLess(counter: number, limit: number, step: number, body: () => void): this {
    this.emit(0x02, 0x40, 0x03, 0x40); // block, loop
    this.get(counter).get(limit).op('i32.ge_s').emit(0x0d, 1); // br_if 1 (exit)
    body();
    this.get(counter).i32(step).op('i32.add').set(counter);
    return this.emit(0x0c, 0, 0x0b, 0x0b); // br 0, end loop, end block
  }
  /** `if (top of stack ≠ 0) { body }` */
  ifTrue(body: () => void): this {
    this.emit(0x04, 0x40);
    body();
    return this.emit(0x0b);
  }

  /** Raw bytes (used by the helpers above). */
  emit(...bytes: number[]): this {
    for (const b of bytes) this.code.push(b);
    return this;
  }

  /** The encoded body: local declarations then code then `end`. */
  encode(): number[] {
    const groups: number[][] = [];
    for (const t of this.localTypes) {
      const last = groups[groups.length - 1];
      if (last && last[1] === TYPE_CODE[t]) last[0]++;
      else groups.push([1, TYPE_CODE[t]]);
    }
    const body = [...unsignedLeb(groups.length), ...groups.flatMap(([count, type]) => [...unsignedLeb(count), type]), ...this.code, 0x0b];
    return [...unsignedLeb(body.length), ...body];
  }
}

/**
 * A module importing memory `env.memory` (shared when asked, with the given page limits) and exporting the
 * functions by name. Functions return nothing.
 */
export function encodeModule(functions: readonly FunctionBuilder[], memory: { shared: boolean; maximumPages: number }): Uint8Array {
  const types = functions.map((f) => [0x60, ...vector(f.params.map((p) => [TYPE_CODE[p]])), 0]);
  const limits = memory.shared ? [0x03, 0, ...unsignedLeb(memory.maximumPages)] : [0x00, 0];
  const bytes = [
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, vector(types)),
    ...section(2, vector([[...name('env'), ...name('memory'), 0x02, ...limits]])),
    ...section(3, vector(functions.map((_, i) => unsignedLeb(i)))),
    ...section(7, vector(functions.map((f, i) => [...name(f.name), 0x00, ...unsignedLeb(i)]))),
    ...section(10, vector(functions.map((f) => f.encode()))),
  ];
  return new Uint8Array(bytes);
}
