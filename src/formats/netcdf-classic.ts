/**
 * Writer of netCDF classic files, 64-bit offset variant (CDF-2), from the published format
 * specification ("The NetCDF Classic Format Specification", Unidata, netCDF User's Guide,
 * appendix "File Format Specifications"). No npm package writes netCDF; readers (netcdfjs,
 * the netCDF C library through python3-netcdf4/xarray) read these files back in the tests.
 *
 * Layout (all numbers big-endian):
 *   magic        'C' 'D' 'F' 0x02
 *   numrecs      INT32, 0 here: no record (unlimited) dimension, every variable has a fixed size
 *   dim_list     NC_DIMENSION (0x0A) nelems [name length]…   or ABSENT (two zero INT32)
 *   gatt_list    NC_ATTRIBUTE (0x0C) nelems [name nc_type nelems values]…   or ABSENT
 *   var_list     NC_VARIABLE (0x0B) nelems [name ndims dimids… vatt_list nc_type vsize begin(INT64)]…
 *   data         each variable's values in row-major order at `begin`, padded to 4 bytes
 * A name is INT32 length + UTF-8 bytes padded with zeros to 4 bytes; attribute values are padded
 * to 4 bytes likewise.
 */

export type NcType = 'byte' | 'char' | 'short' | 'int' | 'float' | 'double';

const TYPE_CODE: Record<NcType, number> = { byte: 1, char: 2, short: 3, int: 4, float: 5, double: 6 };
const TYPE_SIZE: Record<NcType, number> = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };

/** Default fill values of the format (netcdf.h NC_FILL_*), used for missing values. */
export const NC_FILL = { byte: -127, short: -32767, int: -2147483647, float: 9.969209968386869e36, double: 9.969209968386869e36 } as const;

export type NcAttributeValue = string | { type: Exclude<NcType, 'char'>; values: readonly number[] };

export interface NcDimension {
  name: string;
  length: number;
}

export interface NcVariable {
  name: string;
  type: NcType;
  /** Dimension names, slowest varying first. */
  dimensions: readonly string[];
  attributes: Record<string, NcAttributeValue>;
  /**
   * Values in row-major order: numbers (null = the _FillValue attribute, else the format's default fill)
   * or, for char, one string per row.
   */
  values: readonly (number | null)[] | readonly string[];
}

export interface NcFile {
  dimensions: readonly NcDimension[];
  attributes: Record<string, NcAttributeValue>;
  variables: readonly NcVariable[];
}

const NC_DIMENSION = 0x0a;
const NC_VARIABLE = 0x0b;
const NC_ATTRIBUTE = 0x0c;
const NAME_PATTERN = /^[A-Za-z_][A-Za-z0-9_.@+-]*$/;

const pad4 = (n: number) => (4 - (n % 4)) % 4;

/** A growable big-endian byte buffer. */
class Writer {
  private buf = new Uint8Array(4096);
  private view = new DataView(this.buf.buffer);
  length = 0;
  private ensure(extra: number): void {
    if (this.length + extra <= this.buf.length) return;
    let size = this.buf.length * 2;
    while (size < this.length + extra) size *= 2;
    const next = new Uint8Array(size);
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
    this.view = new DataView(next.buffer);
  }
  int32(v: number): void {
    this.ensure(4);
    this.view.setInt32(this.length, v);
    this.length += 4;
  }
  int64(v: number): void {
    this.ensure(8);
    this.view.setBigInt64(this.length, BigInt(v));
    this.length += 8;
  }
  bytes(b: Uint8Array): void {
    this.ensure(b.length);
    this.buf.set(b, this.length);
    this.length += b.length;
  }
  zeros(n: number): void {
    this.ensure(n);
    this.buf.fill(0, this.length, this.length + n);
    this.length += n;
  }
  number(type: NcType, v: number): void {
    const size = TYPE_SIZE[type];
    this.ensure(size);
    const at = this.length;
    if (type === 'byte') this.view.setInt8(at, v);
    else if (type === 'short') this.view.setInt16(at, v);
    else if (type === 'int') this.view.setInt32(at, v);
    else if (type === 'float') this.view.setFloat32(at, v);
    else if (type === 'double') this.view.setFloat64(at, v);
    else this.view.setUint8(at, v);
    this.length += size;
  }
  /** Overwrites an INT64 at a given position (the `begin` offsets, known after the header). */
  patchInt64(at: number, v: number): void {
    this.view.setBigInt64(at, BigInt(v));
  }
  result(): Uint8Array {
    return this.buf.slice(0, this.length);
  }
}

const utf8 = new TextEncoder();

function writeName(w: Writer, name: string): void {
  if (!NAME_PATTERN.test(name)) throw new Error(`netCDF name "${name}" is not allowed`);
  const b = utf8.encode(name);
  w.int32(b.length);
  w.bytes(b);
  w.zeros(pad4(b.length));
}

function writeAttributes(w: Writer, attributes: Record<string, NcAttributeValue>): void {
  const entries = Object.entries(attributes);
  if (entries.length === 0) {
    w.int32(0);
    w.int32(0);
    return;
  }
  w.int32(NC_ATTRIBUTE);
  w.int32(entries.length);
  for (const [name, value] of entries) {
    writeName(w, name);
    if (typeof value === 'string') {
      const b = utf8.encode(value);
      w.int32(TYPE_CODE.char);
      w.int32(b.length);
      w.bytes(b);
      w.zeros(pad4(b.length));
    } else {
      w.int32(TYPE_CODE[value.type]);
      w.int32(value.values.length);
      for (const v of value.values) w.number(value.type, v);
      w.zeros(pad4(value.values.length * TYPE_SIZE[value.type]));
    }
  }
}

/** The file as bytes. Throws for inconsistent shapes (a value count that is not the product of the dimensions). */
export function writeNetcdfClassic(file: NcFile): Uint8Array {
  const dimIndex = new Map(file.dimensions.map((d, i) => [d.name, i]));
  const lengthOf = new Map(file.dimensions.map((d) => [d.name, d.length]));
  const w = new Writer();
  w.bytes(new Uint8Array([0x43, 0x44, 0x46, 0x02]));
  w.int32(0); // numrecs
  if (file.dimensions.length === 0) {
    w.int32(0);
    w.int32(0);
  } else {
    w.int32(NC_DIMENSION);
    w.int32(file.dimensions.length);
    for (const d of file.dimensions) {
      if (!(d.length >= 1)) throw new Error(`netCDF dimension ${d.name} must have length >= 1 (0 means unlimited)`);
      writeName(w, d.name);
      w.int32(d.length);
    }
  }
  writeAttributes(w, file.attributes);

  const beginAt: number[] = [];
  const sizes: number[] = [];
  if (file.variables.length === 0) {
    w.int32(0);
    w.int32(0);
  } else {
    w.int32(NC_VARIABLE);
    w.int32(file.variables.length);
    for (const v of file.variables) {
      writeName(w, v.name);
      w.int32(v.dimensions.length);
      for (const d of v.dimensions) {
        const id = dimIndex.get(d);
        if (id === undefined) throw new Error(`variable ${v.name}: no dimension ${d}`);
        w.int32(id);
      }
      writeAttributes(w, v.attributes);
      w.int32(TYPE_CODE[v.type]);
      const count = v.dimensions.reduce((n, d) => n * lengthOf.get(d)!, 1);
      const bytes = count * TYPE_SIZE[v.type];
      const vsize = bytes + pad4(bytes);
      sizes.push(vsize);
      w.int32(vsize);
      beginAt.push(w.length);
      w.int64(0); // begin, patched below
    }
  }

  file.variables.forEach((v, i) => {
    w.patchInt64(beginAt[i]!, w.length);
    const start = w.length;
    const count = v.dimensions.reduce((n, d) => n * lengthOf.get(d)!, 1);
    const rows = v.type === 'char' ? count / lengthOf.get(v.dimensions[v.dimensions.length - 1]!)! : count;
    if (v.values.length !== rows)
      throw new Error(`variable ${v.name}: ${v.values.length} values for dimensions (${v.dimensions.join(', ')}) of ${rows}`);
    if (v.type === 'char') {
      const rowLength = lengthOf.get(v.dimensions[v.dimensions.length - 1]!)!;
      for (const s of v.values as readonly string[]) {
        const b = utf8.encode(s);
        if (b.length > rowLength) throw new Error(`variable ${v.name}: "${s}" is longer than ${rowLength} bytes`);
        w.bytes(b);
        w.zeros(rowLength - b.length);
      }
    } else {
      const fillAttr = v.attributes._FillValue;
      const fill = typeof fillAttr === 'object' ? fillAttr.values[0]! : NC_FILL[v.type];
      for (const x of v.values as readonly (number | null)[]) w.number(v.type, x === null ? fill : x);
    }
    w.zeros(sizes[i]! - (w.length - start));
  });
  return w.result();
}
