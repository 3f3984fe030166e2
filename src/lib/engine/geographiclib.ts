/**
 * GeographicLib (Karney 2013, J. Geodesy 87, 43) from the npm package geographiclib-geodesic.
 * The package is a UMD bundle: Node's ESM loader exposes it only as a default export, while
 * bundlers may also expose named exports, so take whichever object holds the API.
 */
import * as geodesicModule from 'geographiclib-geodesic';

type GeodesicLib = typeof geodesicModule;
const lib: GeodesicLib =
	(geodesicModule as unknown as { default?: GeodesicLib }).default ?? geodesicModule;

export const Geodesic = lib.Geodesic;
