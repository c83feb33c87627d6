/** One site search hit (/api/v1/map/search): enough to fly to the site and open it. */
export interface SiteSearchHit {
	id: string;
	code: string;
	name: string | null;
	lon: number;
	lat: number;
}
