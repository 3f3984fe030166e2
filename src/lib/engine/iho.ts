/**
 * IHO S-44 Edition 6.0.0 (2020), Table 1: minimum standards for hydrographic surveys at 95%
 * confidence. TVU_max(d) = √(a² + (b·d)²); THU_max = fixed + share of depth.
 */

export type IhoOrder = 'exclusive' | 'special' | '1a' | '1b' | '2';

export const IHO_ORDERS: readonly IhoOrder[] = ['exclusive', 'special', '1a', '1b', '2'];

export interface IhoOrderSpec {
	/** Depth-independent TVU term a (m). */
	a: number;
	/** Depth-dependent TVU coefficient b. */
	b: number;
	/** THU fixed part (m). */
	thuFixedM: number;
	/** THU share of depth (0.05 = 5 %). */
	thuDepthShare: number;
	/** Bathymetric coverage as the table states it. */
	coverage: string;
	/** The coverage figure in percent (for 1a an upper bound: "≤ 100 %"). */
	coveragePercent: number;
}

export const IHO_S44: Readonly<Record<IhoOrder, IhoOrderSpec>> = Object.freeze({
	exclusive: {
		a: 0.15,
		b: 0.0075,
		thuFixedM: 1,
		thuDepthShare: 0,
		coverage: '200%',
		coveragePercent: 200
	},
	special: {
		a: 0.25,
		b: 0.0075,
		thuFixedM: 2,
		thuDepthShare: 0,
		coverage: '100%',
		coveragePercent: 100
	},
	'1a': {
		a: 0.5,
		b: 0.013,
		thuFixedM: 5,
		thuDepthShare: 0.05,
		coverage: '≤100%',
		coveragePercent: 100
	},
	'1b': { a: 0.5, b: 0.013, thuFixedM: 5, thuDepthShare: 0.05, coverage: '5%', coveragePercent: 5 },
	'2': { a: 1.0, b: 0.023, thuFixedM: 20, thuDepthShare: 0.1, coverage: '5%', coveragePercent: 5 }
});

/** Maximum allowable total vertical uncertainty (m, 95 %) at depth d. */
export function tvuMaxM(order: IhoOrder, depthM: number): number {
	const { a, b } = IHO_S44[order];
	return Math.sqrt(a * a + (b * depthM) ** 2);
}

/** Maximum allowable total horizontal uncertainty (m, 95 %) at depth d. */
export function thuMaxM(order: IhoOrder, depthM: number): number {
	const o = IHO_S44[order];
	return o.thuFixedM + o.thuDepthShare * depthM;
}
