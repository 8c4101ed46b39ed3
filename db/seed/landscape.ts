// The demo's invented landscape around its two events (demo-scenario.ts): woods, water,
// paths and streams, as GeoJSON ([longitude, latitude], WGS84). The tile fake
// (server/tiles/render.ts) draws the demo's base map from these; nothing here is a real place.

export type LandscapeKind = "wood" | "water" | "heath" | "pasture" | "path" | "track" | "stream";
export type LandscapeFeature = {
  type: "Feature";
  properties: { kind: LandscapeKind };
  geometry: { type: "Polygon"; coordinates: number[][][] } | { type: "LineString"; coordinates: number[][] };
};

const poly = (kind: LandscapeKind, ring: number[][]): LandscapeFeature => ({
  type: "Feature",
  properties: { kind },
  geometry: { type: "Polygon", coordinates: [[...ring, ring[0]!]] },
});
const line = (kind: LandscapeKind, coordinates: number[][]): LandscapeFeature => ({
  type: "Feature",
  properties: { kind },
  geometry: { type: "LineString", coordinates },
});

export const LANDSCAPE: { type: "FeatureCollection"; features: LandscapeFeature[] } = {
  type: "FeatureCollection",
  features: [
    // Harrowmere Vale: beechwood to the east, an alder strip, the old millpond in the south.
    poly("wood", [
      [-1.8088, 52.1032],
      [-1.7985, 52.1026],
      [-1.7962, 52.1068],
      [-1.7978, 52.1121],
      [-1.8052, 52.1118],
      [-1.8091, 52.1099],
    ]),
    poly("wood", [
      [-1.8262, 52.1112],
      [-1.8214, 52.1108],
      [-1.8205, 52.1141],
      [-1.8251, 52.1152],
    ]),
    poly("water", [
      [-1.8128, 52.1016],
      [-1.8102, 52.1011],
      [-1.8071, 52.1015],
      [-1.8063, 52.1024],
      [-1.8082, 52.1031],
      [-1.8116, 52.1029],
    ]),
    poly("pasture", [
      [-1.826, 52.0968],
      [-1.812, 52.0972],
      [-1.8115, 52.0996],
      [-1.8262, 52.0995],
    ]),
    line("stream", [
      [-1.8128, 52.1018],
      [-1.8152, 52.1009],
      [-1.8171, 52.0996],
      [-1.8203, 52.0983],
      [-1.8251, 52.0975],
    ]),
    line("stream", [
      [-1.7992, 52.1098],
      [-1.8031, 52.1071],
      [-1.8058, 52.1046],
      [-1.8069, 52.1026],
    ]),
    line("path", [
      [-1.8241, 52.1066],
      [-1.8195, 52.1065],
      [-1.8142, 52.1061],
      [-1.8098, 52.1064],
      [-1.8041, 52.1072],
      [-1.7971, 52.1079],
    ]),
    line("path", [
      [-1.8111, 52.1124],
      [-1.8109, 52.1088],
      [-1.8113, 52.1049],
      [-1.8131, 52.1033],
    ]),
    line("track", [
      [-1.8282, 52.0991],
      [-1.8175, 52.0999],
      [-1.8052, 52.1004],
      [-1.7951, 52.1011],
    ]),
    // Kestrel Moor: heather on the ridge, a tarn, gorse and rough pasture below.
    poly("heath", [
      [-2.1032, 53.3027],
      [-2.0869, 53.3022],
      [-2.0861, 53.3078],
      [-2.1041, 53.3083],
    ]),
    poly("pasture", [
      [-2.1038, 53.2968],
      [-2.0862, 53.2971],
      [-2.0869, 53.3002],
      [-2.1034, 53.3004],
    ]),
    poly("water", [
      [-2.0972, 53.3036],
      [-2.0951, 53.3034],
      [-2.0944, 53.3043],
      [-2.0962, 53.3049],
    ]),
    poly("wood", [
      [-2.0891, 53.2985],
      [-2.0852, 53.2983],
      [-2.0848, 53.3005],
      [-2.0886, 53.3008],
    ]),
    line("stream", [
      [-2.0951, 53.3036],
      [-2.0939, 53.3021],
      [-2.0932, 53.3002],
      [-2.0921, 53.2978],
    ]),
    line("path", [
      [-2.1061, 53.3052],
      [-2.0993, 53.3047],
      [-2.0962, 53.3029],
      [-2.0918, 53.3031],
      [-2.0842, 53.3041],
    ]),
    line("track", [
      [-2.1051, 53.2992],
      [-2.0951, 53.2989],
      [-2.0839, 53.2994],
    ]),
  ],
};
