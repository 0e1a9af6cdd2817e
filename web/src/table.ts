/** The sortable station table of the network view (sorting by header buttons, state in aria-sort). */

export interface TableRow {
  stationId: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  /** above mean sea level [m] */
  altitudeM: number;
  pwvMm: number | null;
  sigmaMm: number | null;
  count: number;
  excluded: number;
}

type Key = keyof TableRow;
const COLUMNS: { key: Key; label: string; numeric: boolean; digits?: number }[] = [
  { key: 'stationId', label: 'Station', numeric: false },
  { key: 'name', label: 'Name', numeric: false },
  { key: 'latitudeDeg', label: 'Lat °', numeric: true, digits: 3 },
  { key: 'longitudeDeg', label: 'Lon °', numeric: true, digits: 3 },
  { key: 'altitudeM', label: 'Alt. m (MSL)', numeric: true, digits: 0 },
  { key: 'pwvMm', label: 'PWV mm', numeric: true, digits: 1 },
  { key: 'sigmaMm', label: 'σ mm', numeric: true, digits: 1 },
  { key: 'count', label: 'Epochs', numeric: true, digits: 0 },
  { key: 'excluded', label: 'Left out', numeric: true, digits: 0 },
];

export class StationTable {
  private rows: TableRow[] = [];
  private sortKey: Key = 'stationId';
  private ascending = true;

  constructor(
    private readonly table: HTMLTableElement,
    private readonly onPick: (stationId: string) => void,
  ) {
    const head = table.tHead!.rows[0]!;
    head.replaceChildren();
    for (const c of COLUMNS) {
      const th = document.createElement('th');
      th.scope = 'col';
      const b = document.createElement('button');
      b.type = 'button';
      b.textContent = c.label;
      b.dataset.key = c.key;
      b.addEventListener('click', () => this.sortBy(c.key));
      th.append(b);
      head.append(th);
    }
    this.updateHeader();
    // One listener for every row's button (rows are rebuilt at each hour).
    table.tBodies[0]!.addEventListener('click', (e) => {
      const id = (e.target as Element).closest('button')?.closest('tr')?.dataset.station;
      if (id) this.onPick(id);
    });
  }

  setRows(rows: TableRow[]): void {
    this.rows = rows;
    this.render();
  }

  sortBy(key: Key): void {
    this.ascending = this.sortKey === key ? !this.ascending : true;
    this.sortKey = key;
    this.updateHeader();
    this.render();
  }

  private updateHeader(): void {
    for (const th of this.table.tHead!.rows[0]!.cells) {
      const key = th.querySelector('button')!.dataset.key;
      if (key === this.sortKey) th.setAttribute('aria-sort', this.ascending ? 'ascending' : 'descending');
      else th.removeAttribute('aria-sort');
    }
  }

  private render(): void {
    const k = this.sortKey;
    const dir = this.ascending ? 1 : -1;
    const sorted = [...this.rows].sort((a, b) => {
      const x = a[k];
      const y = b[k];
      if (x === null && y === null) return 0;
      if (x === null) return 1; // no value last, whatever the direction
      if (y === null) return -1;
      return (x < y ? -1 : x > y ? 1 : 0) * dir;
    });
    const body = this.table.tBodies[0]!;
    const fragment = document.createDocumentFragment();
    for (const r of sorted) {
      const tr = document.createElement('tr');
      tr.dataset.station = r.stationId;
      for (const c of COLUMNS) {
        const v = r[c.key];
        const td = document.createElement(c.key === 'stationId' ? 'th' : 'td');
        if (c.key === 'stationId') {
          td.setAttribute('scope', 'row');
          const b = document.createElement('button');
          b.type = 'button';
          b.className = 'link';
          b.textContent = String(v);
          b.setAttribute('aria-label', `Show the series of ${r.stationId}`);
          td.append(b);
        } else {
          td.textContent = v === null ? '–' : c.numeric ? (v as number).toFixed(c.digits) : String(v);
          if (c.numeric) td.className = 'num';
        }
        tr.append(td);
      }
      fragment.append(tr);
    }
    body.replaceChildren(fragment);
  }
}
