// Packages that ship no type declarations; typed only as far as Thermalith uses them.
declare module 's3rver' {
	interface S3rverOptions {
		port?: number;
		address?: string;
		directory?: string;
		silent?: boolean;
		configureBuckets?: { name: string; configs: (string | Buffer)[] }[];
	}
	export default class S3rver {
		constructor(options: S3rverOptions);
		run(): Promise<unknown>;
		close(): Promise<void>;
	}
}

declare module 'geojson-validation' {
	export function valid(geoJson: unknown, trace: true): string[];
	export function valid(geoJson: unknown, trace?: false): boolean;
	export function isFeatureCollection(geoJson: unknown, trace: true): string[];
	export function isFeatureCollection(geoJson: unknown, trace?: false): boolean;
}
