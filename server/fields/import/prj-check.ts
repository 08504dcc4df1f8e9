// A shapefile's .prj names the body its coordinates are on through its ellipsoid. Coordinates on
// Mars or the Moon would reproject to nonsense on Earth, so such a file is refused by name.
// Pure and linear: a small reader of OGC WKT (1 and 2) and of PROJ strings, nothing kept.

/**
 * Semi-major axes accepted as Earth's, metres. Every Earth ellipsoid in use lies well inside
 * (Everest 1830 6,377,276.345 m to International 1924 6,378,388 m; authalic spheres 6,370,997 m);
 * the margin either side is our own choice (common practice, no published source).
 */
export const EARTH_SEMI_MAJOR_M = { min: 6_356_000, max: 6_379_000 } as const;

/** Words in datum and ellipsoid names that mean another body (used when no axis can be read). */
const OTHER_BODIES = new Set([
  'mars',
  'martian',
  'moon',
  'lunar',
  'luna',
  'selene',
  'mercury',
  'venus',
  'jupiter',
  'saturn',
  'uranus',
  'neptune',
  'pluto',
  'charon',
  'io',
  'europa',
  'ganymede',
  'callisto',
  'titan',
  'enceladus',
  'phobos',
  'deimos',
  'ceres',
  'vesta',
  'sun',
]);

const NAMED = new Set([
  'DATUM',
  'GEOGCS',
  'GEOCCS',
  'GEOGCRS',
  'BASEGEOGCRS',
  'GEODCRS',
  'BASEGEODCRS',
  'GEODETICCRS',
  'GEODETICDATUM',
  'TRF',
  'SPHEROID',
  'ELLIPSOID',
]);
const MAX_DEPTH = 64;

export interface WktNode {
  keyword: string;
  args: Array<string | number | WktNode>;
}

/** Reads WKT into a tree, or null when it is not well-formed WKT (proj4 then has the last word). */
export function readWkt(text: string): WktNode[] | null {
  const roots: WktNode[] = [];
  const stack: WktNode[] = [];
  const push = (v: string | number | WktNode) => {
    if (stack.length) stack[stack.length - 1].args.push(v);
    else if (typeof v === 'object') roots.push(v);
  };
  let i = 0;
  const n = text.length;
  while (i < n) {
    const c = text[i];
    if (c === ' ' || c === '\t' || c === '\n' || c === '\r' || c === ',') i++;
    else if (c === '"') {
      let s = '';
      i++;
      for (;;) {
        const q = text.indexOf('"', i);
        if (q < 0) return null;
        s += text.slice(i, q);
        i = q + 1;
        if (text[i] === '"') {
          s += '"';
          i++;
        } else break;
      }
      push(s);
    } else if (c === ']' || c === ')') {
      const done = stack.pop();
      if (!done) return null;
      push(done);
      i++;
    } else if (/[A-Za-z_]/.test(c)) {
      const start = i;
      while (i < n && /[A-Za-z0-9_]/.test(text[i])) i++;
      const word = text.slice(start, i);
      while (i < n && /\s/.test(text[i])) i++;
      if (text[i] === '[' || text[i] === '(') {
        if (stack.length >= MAX_DEPTH) return null;
        stack.push({ keyword: word.toUpperCase(), args: [] });
        i++;
      } else push(word);
    } else {
      const m = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/.exec(text.slice(i, i + 40));
      if (!m) return null;
      push(Number(m[0]));
      i += m[0].length;
    }
  }
  return stack.length ? null : roots;
}

/** What a .prj says about its body: every ellipsoid's semi-major axis (metres) and the datum names. */
export function readBody(prj: string): { semiMajorM: number[]; names: string[] } {
  const semiMajorM: number[] = [];
  const names: string[] = [];
  const text = prj.trim();
  if (text.startsWith('+') || /\+proj=/i.test(text)) {
    // A PROJ string: +a= or +R= are in metres.
    for (const m of text.matchAll(/\+(a|R)=([-+]?[\d.]+(?:[eE][-+]?\d+)?)/g)) semiMajorM.push(Number(m[2]));
    return { semiMajorM, names };
  }
  const walk = (node: WktNode) => {
    if (NAMED.has(node.keyword) && typeof node.args[0] === 'string') names.push(node.args[0]);
    if ((node.keyword === 'SPHEROID' || node.keyword === 'ELLIPSOID') && typeof node.args[1] === 'number') {
      // WKT 1 gives the axis in metres (OGC 01-009); WKT 2 may add its LENGTHUNIT (ISO 19162).
      const unit = node.args.find((a): a is WktNode => typeof a === 'object' && (a.keyword === 'LENGTHUNIT' || a.keyword === 'UNIT'));
      const factor = unit && typeof unit.args[1] === 'number' ? unit.args[1] : 1;
      semiMajorM.push(node.args[1] * factor);
    }
    for (const a of node.args) if (typeof a === 'object') walk(a);
  };
  for (const root of readWkt(text) ?? []) walk(root);
  return { semiMajorM, names };
}

const metres = (m: number) => `${Math.round(m).toLocaleString('en-US')} m`;

/**
 * The reason a .prj is not for Earth, as a sentence for the farmer, or null when it is (or when
 * it says nothing either way: proj4 then decides whether it can be read at all).
 */
export function prjNotOnEarth(prj: string, fileName: string): string | null {
  const { semiMajorM, names } = readBody(prj);
  const refuse = (why: string) => `The coordinate system in ${fileName} is for another body (${why}); Furlong maps fields on Earth`;
  for (const a of semiMajorM) {
    if (!Number.isFinite(a) || a <= 0)
      return `The coordinate system in ${fileName} cannot be read (its ellipsoid has no usable size); export the shapefile again in WGS84 (EPSG:4326) or a UTM zone`;
    if (a < EARTH_SEMI_MAJOR_M.min || a > EARTH_SEMI_MAJOR_M.max) return refuse(`semi-major axis ${metres(a)}`);
  }
  if (semiMajorM.length) return null;
  const body = names.find((name) =>
    name
      .toLowerCase()
      .split(/[^a-z]+/)
      .some((w) => OTHER_BODIES.has(w)),
  );
  return body ? refuse(`datum ${body}`) : null;
}
