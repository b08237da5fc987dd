"use client";
import { keepPreviousData, useQuery, useQueryClient } from "@tanstack/react-query";
import { useTable, type ColumnVisibilityState, type PaginationState, type RowSelectionState, type SortingState, type Updater } from "@tanstack/react-table";
import { useEffect, useId, useMemo, useRef, useState, type Dispatch, type FormEvent, type ReactNode, type SetStateAction } from "react";
import { STAGES } from "@/lib/enums";
import { api } from "@/lib/api-client";
import {
  DEAL_TABLE_DEFAULT_PAGE_SIZE,
  DEAL_TABLE_DEFAULT_SORT,
  DEAL_TABLE_HIDEABLE_COLUMNS,
  parseSort,
  type BulkAnswer,
  type DealTablePage,
  type DealTableQuery,
  type SavedView,
  type SavedViewQuery,
} from "@/lib/schemas/deal-table";
import { STAGE_LABELS } from "@/lib/stages";
import { Field, optionsOf, SelectField } from "@/components/ui/field";
import { useFitTable } from "@/components/ui/table";
import { BulkBar } from "./bulk-bar";
import { Checkbox, dealColumns, features } from "./columns";
import { SavedViewsMenu } from "./saved-views-menu";

const PAGE_SIZES = [25, 50, 100, 200];
const VISIBILITY_KEY = "kilowright.deals-table.hidden-columns";

type Filters = { stage: string; owner: string; source: string; q: string; from: string; to: string };
type View = Filters & { sort: string; page: number; pageSize: number };

function viewFrom(q: DealTableQuery): View {
  return {
    sort: q.sort,
    page: q.page,
    pageSize: q.pageSize,
    stage: q.stage ?? "",
    owner: q.owner ?? "",
    source: q.source ?? "",
    q: q.q ?? "",
    from: q.from ?? "",
    to: q.to ?? "",
  };
}

/** The query string of a view; blank filters and defaults are left out. */
function paramsOf(view: View, withPaging: boolean): URLSearchParams {
  const p = new URLSearchParams();
  if (withPaging) {
    p.set("page", String(view.page));
    p.set("pageSize", String(view.pageSize));
  }
  p.set("sort", view.sort);
  for (const key of ["stage", "owner", "source", "q", "from", "to"] as const) if (view[key]) p.set(key, view[key]);
  return p;
}

function apply<T>(updater: Updater<T>, old: T): T {
  return typeof updater === "function" ? (updater as (o: T) => T)(old) : updater;
}

type HideableColumn = (typeof DEAL_TABLE_HIDEABLE_COLUMNS)[number];
const isHideable = (id: string): id is HideableColumn => (DEAL_TABLE_HIDEABLE_COLUMNS as readonly string[]).includes(id);

function saveHidden(visibility: ColumnVisibilityState) {
  const hidden = Object.entries(visibility)
    .filter(([, visible]) => !visible)
    .map(([id]) => id);
  try {
    window.localStorage.setItem(VISIBILITY_KEY, JSON.stringify(hidden));
  } catch {
    // Private browsing may refuse storage; the choice then lasts for this visit.
  }
}

/** What a saved view keeps of the current view: filters, sort, page size and hidden columns. */
function savedQueryOf(view: View, visibility: ColumnVisibilityState): SavedViewQuery {
  const hiddenColumns = Object.entries(visibility)
    .filter(([id, visible]) => !visible && isHideable(id))
    .map(([id]) => id as HideableColumn);
  const q: SavedViewQuery = { sort: view.sort };
  for (const key of ["stage", "owner", "source", "q", "from", "to"] as const) if (view[key]) (q as Record<string, unknown>)[key] = view[key];
  if (view.pageSize !== DEAL_TABLE_DEFAULT_PAGE_SIZE) q.pageSize = view.pageSize;
  if (hiddenColumns.length > 0) q.hiddenColumns = hiddenColumns;
  return q;
}

const isFiltered = (view: View) => Boolean(view.stage || view.owner || view.source || view.q || view.from || view.to);

/**
 * The view (filters, sort, page), the hidden columns and the selection; the address follows
 * the view, and a new filter or sort starts a new selection.
 */
function useDealsView(initialQuery: DealTableQuery) {
  const [view, setView] = useState<View>(() => viewFrom(initialQuery));
  const [columnVisibility, setColumnVisibility] = useState<ColumnVisibilityState>({});
  const [rowSelection, setRowSelection] = useState<RowSelectionState>({});

  // Hidden columns are a preference of this browser, read after the first render so the
  // server's HTML and the browser's first render agree.
  useEffect(() => {
    try {
      const saved: unknown = JSON.parse(window.localStorage.getItem(VISIBILITY_KEY) ?? "[]");
      if (Array.isArray(saved)) setColumnVisibility(Object.fromEntries(saved.filter((v) => typeof v === "string").map((id) => [id, false])));
    } catch {
      // A damaged preference is simply ignored.
    }
  }, []);

  const key = paramsOf(view, true).toString();

  // A selection belongs to the deals in view: new filters or a new sort start a new one.
  const filterKey = paramsOf(view, false).toString();
  useEffect(() => setRowSelection({}), [filterKey]);

  // The address follows the view, so a reload or a shared link shows the same deals.
  useEffect(() => {
    const next = `${window.location.pathname}?${key}`;
    if (`${window.location.pathname}${window.location.search}` !== next) window.history.replaceState(null, "", next);
  }, [key]);
  return { view, setView, columnVisibility, setColumnVisibility, rowSelection, setRowSelection, key };
}

/** The table model: sorting and paging are the server's (they change the view); hidden columns are remembered here. */
function useDealsTable(showOwner: boolean, timeZone: string, data: DealTablePage, state: ReturnType<typeof useDealsView>) {
  const { view, setView, columnVisibility, setColumnVisibility, rowSelection, setRowSelection } = state;
  const { column: sortColumn, direction } = parseSort(view.sort);
  const sorting: SortingState = useMemo(() => [{ id: sortColumn, desc: direction === "desc" }], [sortColumn, direction]);
  const pagination: PaginationState = useMemo(() => ({ pageIndex: view.page - 1, pageSize: view.pageSize }), [view.page, view.pageSize]);
  const columns = useMemo(() => dealColumns(timeZone, showOwner), [timeZone, showOwner]);

  return useTable({
    features,
    columns,
    data: data.rows,
    getRowId: (row) => row.id,
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    rowCount: data.totalCapped ? -1 : data.total,
    state: { sorting, pagination, columnVisibility, rowSelection },
    onRowSelectionChange: (updater) => setRowSelection((old) => apply(updater, old)),
    onSortingChange: (updater) => {
      const next = apply(updater, sorting)[0];
      setView((v) => ({ ...v, page: 1, sort: next ? `${next.id}:${next.desc ? "desc" : "asc"}` : DEAL_TABLE_DEFAULT_SORT }));
    },
    onPaginationChange: (updater) => {
      const next = apply(updater, pagination);
      setView((v) => ({ ...v, page: next.pageSize !== v.pageSize ? 1 : next.pageIndex + 1, pageSize: next.pageSize }));
    },
    onColumnVisibilityChange: (updater) => {
      setColumnVisibility((old) => {
        const next = apply(updater, old);
        saveHidden(next);
        return next;
      });
    },
  });
}

/** The view a saved query opens on (page 1); a rep's view never filters by owner. */
function viewOfSaved(q: SavedViewQuery, showOwner: boolean): View {
  return {
    sort: q.sort,
    page: 1,
    pageSize: q.pageSize ?? DEAL_TABLE_DEFAULT_PAGE_SIZE,
    stage: q.stage ?? "",
    owner: showOwner ? (q.owner ?? "") : "",
    source: q.source ?? "",
    q: q.q ?? "",
    from: q.from ?? "",
    to: q.to ?? "",
  };
}

type DealsTableModel = ReturnType<typeof useDealsTable>;
type HeaderModel = ReturnType<DealsTableModel["getHeaderGroups"]>[number]["headers"][number];

export function DealsTable({
  initialQuery,
  initial,
  showOwner,
  timeZone,
  owners,
  sources,
}: {
  initialQuery: DealTableQuery;
  initial: DealTablePage;
  showOwner: boolean;
  /** The company's zone: dates in the table are its days. */
  timeZone: string;
  owners: Array<{ id: string; name: string; active?: boolean }>;
  sources: string[];
}) {
  const queryClient = useQueryClient();
  const state = useDealsView(initialQuery);
  const { view, setView, columnVisibility, setColumnVisibility, rowSelection, setRowSelection, key } = state;
  const [search, setSearch] = useState(view.q);
  const [activeViewId, setActiveViewId] = useState<string | null>(null);

  const initialKey = useMemo(() => paramsOf(viewFrom(initialQuery), true).toString(), [initialQuery]);
  const result = useQuery({
    queryKey: ["deals-table", key],
    queryFn: () => api<DealTablePage>(`/api/deals/table?${key}`),
    initialData: key === initialKey ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const data = result.data ?? initial;
  const table = useDealsTable(showOwner, timeZone, data, state);

  const onSearch = (e: FormEvent) => {
    e.preventDefault();
    setView((v) => ({ ...v, q: search.trim(), page: 1 }));
  };

  function applySavedView(saved: SavedView) {
    const q = saved.query;
    setActiveViewId(saved.id);
    setSearch(q.q ?? "");
    setView(viewOfSaved(q, showOwner));
    const visibility: ColumnVisibilityState = Object.fromEntries((q.hiddenColumns ?? []).map((id) => [id, false]));
    setColumnVisibility(visibility);
    saveHidden(visibility);
  }

  function afterBulk(answer: BulkAnswer) {
    // The refused deals stay selected, so they can be tried again (say, with a reason).
    setRowSelection(Object.fromEntries(answer.results.filter((r) => r.outcome === "refused").map((r) => [r.dealId, true] as const)));
    void queryClient.invalidateQueries({ queryKey: ["deals-table"] });
  }

  return (
    <section className="mt-4" aria-label="Deals table">
      <SearchForm search={search} setSearch={setSearch} onSearch={onSearch} />

      <FilterBar view={view} setView={setView} showOwner={showOwner} owners={owners} sources={sources} onClearSearch={() => setSearch("")}>
        <SavedViewsMenu current={savedQueryOf(view, columnVisibility)} activeId={activeViewId} onApply={applySavedView} onActiveChange={setActiveViewId} />
        <ColumnsMenu table={table} />
        <a href={`/api/deals/export?${paramsOf(view, false).toString()}`} download className="btn-quiet">
          Export CSV
        </a>
      </FilterBar>

      <BulkBar
        selectedIds={Object.keys(rowSelection)}
        office={showOwner}
        owners={owners.filter((o) => o.active !== false)}
        onClear={() => setRowSelection({})}
        onDone={afterBulk}
      />

      <CountLine data={data} view={view} fetching={result.isFetching} error={result.error instanceof Error ? result.error.message : null} />
      <DealsGrid table={table} data={data} filtered={isFiltered(view)} fetching={result.isFetching} placeholder={result.isPlaceholderData} />
      <Pager table={table} data={data} view={view} setView={setView} />
    </section>
  );
}

function SearchForm({ search, setSearch, onSearch }: { search: string; setSearch: (text: string) => void; onSearch: (e: FormEvent) => void }) {
  return (
    <form role="search" className="flex flex-wrap gap-2" action="/deals" onSubmit={onSearch}>
      <label htmlFor="deal-search" className="sr-only">
        Search deals
      </label>
      <input
        id="deal-search"
        name="q"
        value={search}
        onChange={(e) => setSearch(e.target.value)}
        placeholder="Household, contact, street or city"
        className="field-input max-w-md"
      />
      <button type="submit" className="btn-quiet">
        Search
      </button>
    </form>
  );
}

/** The filters of the view, and (as children) the saved views, the columns menu and the export. */
function FilterBar(props: {
  view: View;
  setView: Dispatch<SetStateAction<View>>;
  showOwner: boolean;
  owners: Array<{ id: string; name: string }>;
  sources: string[];
  onClearSearch: () => void;
  children: ReactNode;
}) {
  const { view, setView, showOwner, owners, sources, onClearSearch } = props;
  const ids = useId();
  const setFilter = (key: keyof Filters, value: string) => setView((v) => ({ ...v, [key]: value, page: 1 }));
  const filtered = isFiltered(view);
  return (
    <div className="mt-3 flex flex-wrap items-end gap-3">
      <SelectField id={`${ids}-stage`} label="Stage" value={view.stage} onChange={(e) => setFilter("stage", e.target.value)} options={[{ value: "", label: "All stages" }, ...optionsOf(STAGES, STAGE_LABELS)]} />
      {showOwner ? (
        <SelectField id={`${ids}-owner`} label="Owner" value={view.owner} onChange={(e) => setFilter("owner", e.target.value)} options={[{ value: "", label: "Everyone" }, ...owners.map((o) => ({ value: o.id, label: o.name }))]} />
      ) : null}
      <SelectField id={`${ids}-source`} label="Source" value={view.source} onChange={(e) => setFilter("source", e.target.value)} options={[{ value: "", label: "Any source" }, ...sources.map((s) => ({ value: s, label: s }))]} />
      <Field id={`${ids}-from`} label="Created from" type="date" value={view.from} max={view.to || undefined} onChange={(e) => setFilter("from", e.target.value)} />
      <Field id={`${ids}-to`} label="Created to" type="date" value={view.to} min={view.from || undefined} onChange={(e) => setFilter("to", e.target.value)} />
      {filtered ? (
        <button
          type="button"
          className="btn-quiet"
          onClick={() => {
            onClearSearch();
            setView((v) => ({ ...v, stage: "", owner: "", source: "", q: "", from: "", to: "", page: 1 }));
          }}
        >
          Clear filters
        </button>
      ) : null}
      <div className="ml-auto flex flex-wrap items-end gap-2">
        {props.children}
      </div>
    </div>
  );
}

function ColumnsMenu({ table }: { table: DealsTableModel }) {
  return (
    <details className="relative">
      <summary className="btn-quiet cursor-pointer list-none">Columns</summary>
      <fieldset className="card absolute right-0 z-10 mt-1 w-56 p-3">
        <legend className="sr-only">Columns to show</legend>
        {table.getAllLeafColumns().map((column) => (
          <label key={column.id} className="flex min-h-touch items-center gap-2 text-sm">
            <input
              type="checkbox"
              className="h-5 w-5 accent-copper"
              checked={column.getIsVisible()}
              disabled={!column.getCanHide()}
              onChange={column.getToggleVisibilityHandler()}
            />
            {column.columnDef.meta?.label ?? column.id}
          </label>
        ))}
      </fieldset>
    </details>
  );
}

/** Which deals of how many are shown, and any failure to fetch them. */
function CountLine({ data, view, fetching, error }: { data: DealTablePage; view: View; fetching: boolean; error: string | null }) {
  const firstRow = data.rows.length === 0 ? 0 : (view.page - 1) * view.pageSize + 1;
  const lastRow = firstRow === 0 ? 0 : firstRow + data.rows.length - 1;
  return (
    <>
      <p className="mt-3 text-sm text-graphite-soft" aria-live="polite">
        {data.total === 0 ? (
          "No deals"
        ) : (
          <>
            Deals <span className="figure">{firstRow}</span>–<span className="figure">{lastRow}</span> of {data.totalCapped ? "more than " : ""}
            <span className="figure">{data.total.toLocaleString("en-US")}</span>
          </>
        )}
        {view.q ? ` matching “${view.q}”` : ""}
        {fetching ? " · updating…" : ""}
      </p>
      {error ? (
        <p role="alert" className="mt-2 text-sm text-danger">
          {error}
        </p>
      ) : null}
    </>
  );
}

/** Below 720 px the nine columns are too squeezed: the low-priority ones go, then rows become cards (useFitTable). */
const FULL_TABLE_WIDTH = 720;

function DealsGrid({ table, data, filtered, fetching, placeholder }: { table: DealsTableModel; data: DealTablePage; filtered: boolean; fetching: boolean; placeholder: boolean }) {
  const frame = useRef<HTMLDivElement>(null);
  const grid = useRef<HTMLTableElement>(null);
  useFitTable(frame, grid, FULL_TABLE_WIDTH);
  return (
    <div ref={frame} className={`relative mt-2 overflow-x-auto rounded-card border [contain:inline-size] border-paper-line bg-white ${placeholder ? "opacity-70" : ""}`}>
      <table ref={grid} className="fit-table w-full text-left text-sm" aria-busy={fetching}>
        <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <HeaderCell key={header.id} table={table} header={header} />
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-paper-line">
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className={row.getIsSelected() ? "bg-copper-light/40" : "hover:bg-paper"}>
              {row.getVisibleCells().map((cell) => (
                <td
                  key={cell.id}
                  data-priority={cell.column.columnDef.meta?.priority}
                  className={`px-3 py-2 ${cell.column.id === "household" ? "" : "whitespace-nowrap"} ${cell.column.columnDef.meta?.align === "right" ? "text-right" : ""}`}
                >
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {data.rows.length === 0 ? <p className="px-4 py-6 text-graphite-soft">{filtered ? "No deal matches these filters." : "No deals yet."}</p> : null}
    </div>
  );
}

/** A column heading: sorts on click; the household column also holds "select every deal on this page". */
function HeaderCell({ table, header }: { table: DealsTableModel; header: HeaderModel }) {
  const sorted = header.column.getIsSorted();
  const right = header.column.columnDef.meta?.align === "right";
  const selectAll =
    header.column.id === "household" ? (
      <Checkbox
        aria-label="Select every deal on this page"
        checked={table.getIsAllPageRowsSelected()}
        indeterminate={table.getIsSomePageRowsSelected()}
        onChange={table.getToggleAllPageRowsSelectedHandler()}
      />
    ) : null;
  return (
    <th
      scope="col"
      data-label={header.column.columnDef.meta?.label}
      data-priority={header.column.columnDef.meta?.priority}
      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
      className={`px-3 py-1 font-semibold ${right ? "text-right" : ""}`}
    >
      {selectAll ? <span className="mr-3 inline-flex align-middle">{selectAll}</span> : null}
      <button
        type="button"
        onClick={header.column.getToggleSortingHandler()}
        className={`inline-flex min-h-touch items-center gap-1 uppercase tracking-wide hover:text-copper ${right ? "flex-row-reverse" : ""}`}
      >
        <table.FlexRender header={header} />
        <span aria-hidden="true" className="w-3 text-copper">
          {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : ""}
        </span>
      </button>
    </th>
  );
}

function Pager({ table, data, view, setView }: { table: DealsTableModel; data: DealTablePage; view: View; setView: Dispatch<SetStateAction<View>> }) {
  const ids = useId();
  // Past DEAL_TABLE_COUNT_LIMIT the server stops counting: the last page is then unknown, and
  // Next follows the server's hasNextPage.
  const pageCount = Math.max(1, Math.ceil(data.total / view.pageSize));
  const goTo = (page: number) => setView((v) => ({ ...v, page: Math.max(1, page) }));
  return (
    <nav className="mt-3 flex flex-wrap items-center justify-between gap-3" aria-label="Pages">
      <div className="flex items-center gap-2 text-sm">
        <label htmlFor={`${ids}-size`}>Rows per page</label>
        <select id={`${ids}-size`} className="field-input w-24" value={view.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
          {PAGE_SIZES.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </div>
      <div className="flex items-center gap-2">
        <button type="button" className="btn-quiet" onClick={() => goTo(1)} disabled={view.page <= 1}>
          First
        </button>
        <button type="button" className="btn-quiet" onClick={() => goTo(view.page - 1)} disabled={view.page <= 1}>
          Previous
        </button>
        <span className="text-sm">
          Page <span className="figure">{view.page}</span>
          {data.totalCapped ? null : (
            <>
              {" "}
              of <span className="figure">{pageCount}</span>
            </>
          )}
        </span>
        <button type="button" className="btn-quiet" onClick={() => goTo(view.page + 1)} disabled={!data.hasNextPage}>
          Next
        </button>
        <button
          type="button"
          className="btn-quiet"
          onClick={() => goTo(pageCount)}
          disabled={data.totalCapped || view.page >= pageCount}
          title={data.totalCapped ? "Too many deals to count: narrow the filters, or export the view" : undefined}
        >
          Last
        </button>
      </div>
    </nav>
  );
}
