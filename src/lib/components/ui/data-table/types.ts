/** A column of a DataTable: its id (also the sort key sent to the server), label and options. */
export interface DataColumn {
	id: string;
	label: string;
	sortable?: boolean;
	align?: 'left' | 'right';
}

/** The sort a DataTable shows; the server does the sorting. */
export interface DataSort {
	id: string;
	desc: boolean;
}
