// Budgets on every expensive input, in one place. The server checks them before any work starts
// and the app shows them as plain limits. Each is sized from what a real farm needs, with a margin.

/**
 * Largest field a plan is sized for: two miles on a side (four sections, 2,560 ac), the largest
 * single field a northern-plains farm is likely to work (common practice, no published source).
 */
export const LARGEST_FIELD_SIDE_M = 2 * 1609.344;

/**
 * Narrowest implement a plan is sized for: 10 ft (a small swather or hay mower; common practice,
 * no published source). Narrower widths still plan, on fields small enough to stay in budget.
 */
export const NARROWEST_IMPLEMENT_M = 3.048;

/**
 * Passes per plan: the largest field's diagonal at the narrowest implement (about 1,500), doubled.
 */
export const MAX_PASSES = 3_000;

/**
 * Pass segments per plan: every pass broken ten times by holes, draws and hazard clearances.
 */
export const MAX_SEGMENTS = 30_000;

/**
 * Positions in one field boundary (all rings). A section's edge walked with a GPS receiver at one
 * position per metre has about 6,500; boundary files from county GIS rarely reach 20,000.
 */
export const MAX_BOUNDARY_VERTICES = 50_000;

/** Rings in one field boundary: outer rings of its parts plus their holes. */
export const MAX_BOUNDARY_RINGS = 1_000;

/** Positions in all the hazards of one field together. */
export const MAX_HAZARD_VERTICES = 20_000;

/** Largest boundary file accepted for upload, bytes (as sent). */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

/** Largest total size of the files inside a zip or KMZ once unpacked, bytes. */
export const MAX_UNPACKED_BYTES = 64 * 1024 * 1024;

/** Most files inside one zip or KMZ. */
export const MAX_ARCHIVE_ENTRIES = 500;

/** Most shapes (features) read from one boundary file. */
export const MAX_FILE_FEATURES = 2_000;

/** Most positions in all the shapes of one boundary file together. */
export const MAX_FILE_VERTICES = 500_000;

/**
 * Positions in one track file (coverage): a whole day logged at one position per second is 86,400;
 * twice that, with a margin, bounds a file of a long day at a faster rate.
 */
export const MAX_TRACK_POINTS = 200_000;

/** Deepest nesting of elements (XML) or of arrays and objects (JSON) in an uploaded file. */
export const MAX_NESTING_DEPTH = 64;

/** A heavy computation (plan preview, boundary check, file import) that runs longer is stopped, ms. */
export const COMPUTE_TIME_LIMIT_MS = 20_000;

/** Memory one heavy computation may use (the worker's JavaScript heap), MB. */
export const COMPUTE_MEMORY_LIMIT_MB = 512;

const int = (n: number) => n.toLocaleString('en-US');
const mb = (bytes: number) => `${Math.round(bytes / (1024 * 1024))} MB`;

/** The limits in plain words, for the screens that take these inputs. */
export const LIMIT_TEXT = {
  upload: `Files up to ${mb(MAX_UPLOAD_BYTES)} (${mb(MAX_UNPACKED_BYTES)} once unzipped), at most ${int(MAX_FILE_FEATURES)} shapes and ${int(MAX_BOUNDARY_VERTICES)} points per field.`,
  boundary: `A boundary may have at most ${int(MAX_BOUNDARY_VERTICES)} points in ${int(MAX_BOUNDARY_RINGS)} rings.`,
  plan: `A plan may have at most ${int(MAX_PASSES)} passes and ${int(MAX_SEGMENTS)} pass segments.`,
} as const;

/** The most actions one send of a phone's outbox may carry (`POST /api/run-sheet/outbox`). */
export const OUTBOX_BATCH_MAX = 200;

/** Points in one chunk of a phone's recorded track: a few minutes of driving at one point a second. */
export const MAX_POINTS_PER_CHUNK = 600;
