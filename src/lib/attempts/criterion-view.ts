// One criterion's result as pages show it: the verdict page, the mentor's view and the author's trial share this shape.

export interface EvidenceRow {
	/** 'share', 'measured', 'predicted', 'blown': the page styles and pairs rows by it */
	key: 'share' | 'measured' | 'predicted' | 'blown';
	label: string;
	value: string;
}

export interface CriterionView {
	kind: string;
	verdict: 'pass' | 'fail' | 'unknown';
	/** the criterion in plain words, as on the Assignment card */
	asked: string;
	measured: string;
	target: string;
	message: string;
	/** what the pixels showed: the flash's share, measured beside predicted subject level, blown share */
	evidence: EvidenceRow[];
}
