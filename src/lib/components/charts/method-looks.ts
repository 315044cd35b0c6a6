/**
 * How each method's series is drawn. Class names are written out in full so Tailwind generates
 * them; the dash pattern and the marker shape keep series apart for readers who cannot rely on
 * colour.
 */
export type MethodLook = {
	stroke: string;
	fill: string;
	swatch: string;
	dash: string | undefined;
	square: boolean;
};

const looks: MethodLook[] = [
	{ stroke: 'stroke-ink', fill: 'fill-ink', swatch: 'bg-ink', dash: undefined, square: false },
	{ stroke: 'stroke-brass', fill: 'fill-brass', swatch: 'bg-brass', dash: undefined, square: true },
	{
		stroke: 'stroke-ink-faint',
		fill: 'fill-ink-faint',
		swatch: 'bg-ink-faint',
		dash: '6 3',
		square: false
	},
	{
		stroke: 'stroke-brass-deep',
		fill: 'fill-brass-deep',
		swatch: 'bg-brass-deep',
		dash: '2 3',
		square: true
	}
];

/** The look of the series at `index`, cycling when there are more series than looks. */
export function methodLook(index: number): MethodLook {
	return looks[index % looks.length];
}
