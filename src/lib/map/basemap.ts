import type { FeatureCollection, MultiLineString } from 'geojson';
import { feature, mesh } from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
// Vite emits these Natural Earth TopoJSON files (world-atlas package) as the app's own assets.
import countriesUrl from 'world-atlas/countries-50m.json?url';
import landUrl from 'world-atlas/land-50m.json?url';

export interface OfflineBasemap {
	land: FeatureCollection;
	borders: MultiLineString;
}

type LandTopology = Topology<{ land: GeometryCollection }>;
type CountryTopology = Topology<{ countries: GeometryCollection }>;

/** Load Natural Earth land polygons and country borders (borders between countries only). */
export async function loadOfflineBasemap(fetcher: typeof fetch = fetch): Promise<OfflineBasemap> {
	const [landTopo, countryTopo] = await Promise.all([
		fetcher(landUrl).then((r) => r.json() as Promise<LandTopology>),
		fetcher(countriesUrl).then((r) => r.json() as Promise<CountryTopology>)
	]);
	const land = feature(landTopo, landTopo.objects.land) as unknown as FeatureCollection;
	const borders = mesh(countryTopo, countryTopo.objects.countries, (a, b) => a !== b);
	return { land, borders };
}
