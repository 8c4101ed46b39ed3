// Reads a PostGIS point as node-postgres hands it over: (extended) well-known binary in
// hex (OGC Simple Features WKB, with PostGIS's SRID flag 0x20000000 for EWKB; from memory).
// Pure: no database, no framework.

export type LonLat = { longitude: number; latitude: number };

const WKB_POINT = 1;
const EWKB_SRID_FLAG = 0x20000000;
const EWKB_Z_FLAG = 0x80000000;
const EWKB_M_FLAG = 0x40000000;

/** The longitude and latitude of a 2D (or 3D/measured: extra numbers ignored) point in hex (E)WKB. */
export function pointFromWkbHex(hex: string): LonLat {
  if (!/^([0-9a-f]{2})+$/i.test(hex)) throw new Error("not hex WKB");
  const bytes = new Uint8Array(hex.length / 2);
  for (let i = 0; i < bytes.length; i++) bytes[i] = parseInt(hex.slice(2 * i, 2 * i + 2), 16);
  const view = new DataView(bytes.buffer);
  if (bytes.length < 5) throw new Error("WKB too short");
  const little = bytes[0] === 1;
  const type = view.getUint32(1, little);
  const base = type & ~(EWKB_SRID_FLAG | EWKB_Z_FLAG | EWKB_M_FLAG);
  // ISO WKB writes Z/M points as 1001, 2001, 3001.
  if (base % 1000 !== WKB_POINT) throw new Error(`WKB type ${type} is not a point`);
  const at = 5 + (type & EWKB_SRID_FLAG ? 4 : 0);
  if (bytes.length < at + 16) throw new Error("WKB too short");
  return { longitude: view.getFloat64(at, little), latitude: view.getFloat64(at + 8, little) };
}
