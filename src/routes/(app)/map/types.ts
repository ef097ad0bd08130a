export interface TrapProps {
	id: number;
	name: string;
	kind: string;
	farm: string;
	latest: {
		readOn: string;
		daysOut: number;
		alateTotal: number;
		alateCounts: Record<string, number>;
	} | null;
}
