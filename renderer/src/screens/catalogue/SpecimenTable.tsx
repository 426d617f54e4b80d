import { useVirtualizer } from '@tanstack/react-virtual';
import { memo, useEffect, useRef } from 'react';
import { cellText, COLUMNS, type FieldName, type SpecimenRecord, type TableQuery } from './specimen-view';

const ROW_HEIGHT = 30;
const TOTAL_WIDTH = COLUMNS.reduce((s, c) => s + c.width, 0);
/** Rows drawn beyond the visible ones on each side. */
const OVERSCAN = 5;
/**
 * Row keys cycle through this many slots: the rows in the page always cover fewer indices
 * than this, so keys stay unique, and a row scrolled out hands its DOM nodes to the row
 * scrolled in (text changes instead of elements removed and created).
 */
const KEY_SLOTS = 512;
/** One style object per column, made once, so React never compares or rewrites them. */
const CELL_STYLES = COLUMNS.map((c) => ({ width: c.width }));

/**
 * The specimen table: only the rows in view are in the page, so 10,000 records scroll as
 * smoothly as 100. Arrow keys move the selection, Home/End jump, Enter opens the specimen,
 * E edits it in the entry strip; column headers sort (again to reverse).
 */
export function SpecimenTable(props: {
  rows: SpecimenRecord[];
  total: number;
  query: TableQuery;
  onSort: (field: FieldName) => void;
  selected: number | null;
  onSelect: (id: number) => void;
  onOpen: (id: number) => void;
  onEdit: (id: number) => void;
}) {
  const { rows, selected } = props;
  const scroller = useRef<HTMLDivElement>(null);
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scroller.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: OVERSCAN,
  });
  const selectedIndex = selected === null ? -1 : rows.findIndex((r) => r.id === selected);

  useEffect(() => {
    if (selectedIndex >= 0) virtualizer.scrollToIndex(selectedIndex, { align: 'auto' });
  }, [selectedIndex, virtualizer]);

  function onKeyDown(e: React.KeyboardEvent): void {
    if (rows.length === 0) return;
    const page = Math.max(1, Math.floor((scroller.current?.clientHeight ?? 300) / ROW_HEIGHT) - 1);
    let next = selectedIndex;
    if (e.key === 'ArrowDown') next = Math.min(rows.length - 1, selectedIndex + 1);
    else if (e.key === 'ArrowUp') next = Math.max(0, selectedIndex - 1);
    else if (e.key === 'PageDown') next = Math.min(rows.length - 1, selectedIndex + page);
    else if (e.key === 'PageUp') next = Math.max(0, selectedIndex - page);
    else if (e.key === 'Home') next = 0;
    else if (e.key === 'End') next = rows.length - 1;
    else if (e.key === 'Enter' && selected !== null) {
      e.preventDefault();
      props.onOpen(selected);
      return;
    } else if ((e.key === 'e' || e.key === 'F2') && selected !== null) {
      e.preventDefault();
      props.onEdit(selected);
      return;
    } else return;
    e.preventDefault();
    if (next < 0) next = 0;
    props.onSelect(rows[next].id);
  }

  const activeId = selected !== null ? `specimen-row-${selected}` : undefined;
  return (
    <div className="specimen-table">
      <div
        ref={scroller}
        className="table-scroll"
        role="grid"
        tabIndex={0}
        aria-label={`Specimens, ${rows.length} of ${props.total} shown`}
        aria-rowcount={rows.length + 1}
        aria-colcount={COLUMNS.length}
        aria-activedescendant={selectedIndex >= 0 ? activeId : undefined}
        data-shown-query={props.query.text}
        onKeyDown={onKeyDown}
        onFocus={() => {
          if (selectedIndex < 0 && rows.length > 0) props.onSelect(rows[0].id);
        }}
      >
        <div className="table-head" role="row" aria-rowindex={1} style={{ width: TOTAL_WIDTH }}>
          {COLUMNS.map((c) => {
            const sorted = props.query.sort.field === c.field;
            return (
              <div
                key={c.field}
                role="columnheader"
                aria-sort={sorted ? (props.query.sort.descending ? 'descending' : 'ascending') : 'none'}
                style={{ width: c.width }}
                className={c.numeric ? 'num' : ''}
              >
                <button type="button" tabIndex={-1} onClick={() => props.onSort(c.field)} title={`Sort by ${c.label}`}>
                  {c.label}
                  <span aria-hidden="true" className="sort-mark">
                    {sorted ? (props.query.sort.descending ? '▼' : '▲') : ''}
                  </span>
                </button>
              </div>
            );
          })}
        </div>
        <div className="table-body" style={{ height: virtualizer.getTotalSize(), width: TOTAL_WIDTH }}>
          {virtualizer.getVirtualItems().map((v) => {
            const r = rows[v.index];
            return <Row key={v.index % KEY_SLOTS} record={r} index={v.index} start={v.start} selected={r.id === selected} onSelect={props.onSelect} onOpen={props.onOpen} />;
          })}
        </div>
        {rows.length === 0 && <p className="empty">No specimen matches.</p>}
      </div>
    </div>
  );
}

/** One row; memoised so scrolling renders only the rows that come into view. */
const Row = memo(function Row(props: {
  record: SpecimenRecord;
  index: number;
  start: number;
  selected: boolean;
  onSelect: (id: number) => void;
  onOpen: (id: number) => void;
}) {
  const r = props.record;
  return (
    <div
      id={`specimen-row-${r.id}`}
      role="row"
      aria-rowindex={props.index + 2}
      aria-selected={props.selected}
      className={`table-row${props.selected ? ' selected' : ''}${props.index % 2 ? ' alt' : ''}`}
      style={{ transform: `translateY(${props.start}px)`, height: ROW_HEIGHT }}
      onClick={() => props.onSelect(r.id)}
      onDoubleClick={() => props.onOpen(r.id)}
    >
      {COLUMNS.map((c, i) => (
        <div key={c.field} role="gridcell" style={CELL_STYLES[i]} className={c.numeric ? 'num' : undefined}>
          {cellText(r, c.field)}
        </div>
      ))}
    </div>
  );
});
