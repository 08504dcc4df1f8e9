// A position is a figure like any other: written by shared/figures.ts.
export { formatLatLon } from '../figures';
