import { lazy, Suspense, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { CameraView, CreatePinBody, Pin } from '../../../shared/api/critique.js';
import type { StudioRole } from '../../../shared/api/roles.js';
import type { AuditReportDto, RevisionDetail } from '../../../shared/api/revisions.js';
import { Button } from '../../components/ui/button.js';
import { describeError, ErrorState } from '../../components/ui/error-state.js';
import { ListSkeleton } from '../../components/ui/query-view.js';
import { Spinner } from '../../components/ui/spinner.js';
import type { PlacedPin, ViewerFocus, ViewerPin, ViewerPins } from '../../features/viewer/components/model-viewer.js';
import { useCreatePin } from '../../features/pins/api/create-pin.js';
import { PIN_POLL_MS, useRevisionPins } from '../../features/pins/api/get-revision-pins.js';
import { type NewPinValues, NewPinForm, type PinDraft } from '../../features/pins/components/new-pin-form.js';
import { PinList } from '../../features/pins/components/pin-list.js';
import { PinThread } from '../../features/pins/components/pin-thread.js';
import { ALL_PINS, type PinFilters, filterPins, newActivity, pinLabel, plural } from '../../features/pins/components/pin-words.js';

// Composes two features (the viewer and the pins), so it lives with the app, not inside either;
// the revision page and the pin-up presentation both show it.
// three.js and the viewer load only when a model is shown.
const ModelViewer = lazy(() => import('../../features/viewer/components/model-viewer.js'));

/** The signed-in person as the critique needs them: who they are and their role in the studio. */
export interface CritiqueViewer {
  readonly id: number;
  readonly name: string;
  /** Role in the revision's studio, or null (an admin looking in). */
  readonly role: StudioRole | null;
}

export interface RevisionCritiqueProps {
  revision: Pick<RevisionDetail, 'id' | 'number' | 'design' | 'participant'>;
  /** The revision's audit report; null while the audit is not done (the list still shows). */
  report: AuditReportDto | null;
  /** Shows pins and threads without placing, replying, resolving or changing categories. */
  readOnly?: boolean;
  /** A lower model with its details below it (presentation, side-by-side pages). */
  compact?: boolean;
  /** The signed-in person; without it only the server's `canPin` opens the write controls. */
  viewer?: CritiqueViewer | null;
  /** A finding's pieces to show on the model (the revision page's findings table). */
  focus?: ViewerFocus | null;
  onClearFocus?: () => void;
  /**
   * The selected pin, when the caller keeps it (a presentation stepping through pins); a new id
   * selects that pin and flies to its view. Leave undefined to let the list and markers decide.
   */
  selectedPinId?: number | null;
  /** Told whenever the list, a marker or Close selects another pin (or none). */
  onSelectedPinChange?: (pinId: number | null) => void;
}

function isTyping(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName);
}

/**
 * A revision's model with its critics' pins: the 3-D viewer with a marker per pin, the pin list
 * beside it (below on narrow screens) and the selected pin's thread. Critics and instructors
 * (`canPin`) place pins with the "Place a pin" button or the P key and a click on a piece (or,
 * by keyboard, a piece chosen with the arrow keys and Enter); Escape cancels. The list and the
 * markers select each other; choosing a pin in the list flies to the view it was placed from.
 * New pins and replies appear by themselves (asked for every 5 s while the page is visible).
 */
export function RevisionCritique({
  revision,
  report,
  readOnly = false,
  compact = false,
  viewer = null,
  focus = null,
  onClearFocus,
  selectedPinId,
  onSelectedPinChange,
}: RevisionCritiqueProps) {
  const query = useRevisionPins(revision.id);
  const data = query.data;
  const pins = useMemo(() => data?.pins ?? [], [data]);
  const isOwner = viewer !== null && viewer.id === revision.participant.id;
  const canPlace = !readOnly && Boolean(data?.canPin);
  const canTalk = !readOnly && (Boolean(data?.canPin) || isOwner || viewer?.role === 'instructor');
  const create = useCreatePin(revision.id, { id: viewer?.id ?? 0, name: viewer?.name ?? 'You', role: viewer?.role ?? 'critic' });

  const [filters, setFilters] = useState<PinFilters>(ALL_PINS);
  const [chosen, setChosen] = useState<{ revisionId: number; pinId: number } | null>(null);
  const controlled = selectedPinId !== undefined;
  const selectedId = controlled ? selectedPinId : chosen && chosen.revisionId === revision.id ? chosen.pinId : null;
  const changeRef = useRef(onSelectedPinChange);
  changeRef.current = onSelectedPinChange;
  const setSelected = useCallback((next: { revisionId: number; pinId: number } | null) => {
    setChosen(next);
    changeRef.current?.(next ? next.pinId : null);
  }, []);
  const selectedPin = selectedId === null ? null : (pins.find((p) => p.id === selectedId) ?? null);
  const [placing, setPlacing] = useState(false);
  const [draft, setDraft] = useState<{ at: PinDraft; values?: NewPinValues; problem?: string } | null>(null);
  const [view, setView] = useState<ViewerPins['view']>(null);
  const panel = useRef<HTMLDivElement>(null);
  // New pins and replies from others, said once in the live region when a poll brings them.
  const [news, setNews] = useState<string | null>(null);
  const lastPins = useRef<readonly Pin[] | null>(null);
  useEffect(() => {
    if (!data) return;
    const before = lastPins.current;
    lastPins.current = data.pins;
    if (before) {
      const said = newActivity(before, data.pins, viewer?.id ?? null);
      if (said) setNews(`Just in: ${said}.`);
    }
  }, [data, viewer?.id]);
  const cameraRef = useRef<(() => CameraView) | null>(null);
  const focusPlaceButton = useCallback(
    () => requestAnimationFrame(() => panel.current?.querySelector<HTMLButtonElement>('button[aria-keyshortcuts="P"]')?.focus({ preventScroll: true })),
    [],
  );

  const hasDraft = useRef(false);
  hasDraft.current = draft !== null;
  const cancelPlacing = useCallback(() => {
    // Leaving the form hands the keyboard back to the button that started placing.
    if (hasDraft.current) focusPlaceButton();
    setPlacing(false);
    setDraft(null);
  }, [focusPlaceButton]);

  // P toggles place-a-pin mode and Escape leaves it, anywhere on the page but in a text box.
  useEffect(() => {
    if (!canPlace) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || e.altKey || e.ctrlKey || e.metaKey) return;
      if (e.key === 'Escape') {
        cancelPlacing();
        return;
      }
      if ((e.key === 'p' || e.key === 'P') && !isTyping(e.target)) {
        e.preventDefault();
        setPlacing((on) => !on);
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [canPlace, cancelPlacing]);
  useEffect(() => {
    if (!canPlace) cancelPlacing();
  }, [canPlace, cancelPlacing]);

  const viewerPins = useMemo<ViewerPin[]>(
    () =>
      pins.map((p) => ({ key: String(p.id), number: p.number, anchor: p.anchor, scope: p.scope, resolved: p.state === 'resolved', outdated: p.outdated, label: pinLabel(p) })),
    [pins],
  );

  /** The pin whose view was last flown to (or chosen here), so a caller's echo does not fly again. */
  const flownTo = useRef<number | null>(null);
  const selectPin = useCallback(
    (pin: Pin, fly: boolean) => {
      flownTo.current = pin.id;
      setSelected({ revisionId: revision.id, pinId: pin.id });
      if (fly) setView((v) => ({ key: (v?.key ?? 0) + 1, camera: pin.camera }));
    },
    [revision.id, setSelected],
  );
  // A caller-held selection flies to the pin's view whenever it names another pin.
  useEffect(() => {
    if (!controlled || selectedPinId == null || flownTo.current === selectedPinId) return;
    const pin = pins.find((p) => p.id === selectedPinId);
    if (!pin) return;
    flownTo.current = selectedPinId;
    setView((v) => ({ key: (v?.key ?? 0) + 1, camera: pin.camera }));
  }, [controlled, selectedPinId, pins]);
  const onMarker = useCallback(
    (key: string) => {
      const pin = pins.find((p) => String(p.id) === key);
      if (!pin) return;
      selectPin(pin, false);
      setFilters((f) => (filterPins([pin], f).length ? f : ALL_PINS));
      requestAnimationFrame(() => panel.current?.querySelector(`[data-pin-id="${pin.id}"]`)?.scrollIntoView?.({ block: 'nearest' }));
    },
    [pins, selectPin],
  );
  const onPlace = useCallback((placed: PlacedPin) => {
    // Only state changes here: the form and the draft marker appear on the next render.
    setDraft({ at: { anchor: placed.anchor, camera: placed.camera, orbitSize: placed.orbitSize } });
    setPlacing(false);
  }, []);

  const save = (body: CreatePinBody, values: NewPinValues) => {
    const at = draft?.at;
    setDraft(null);
    focusPlaceButton();
    // The view at the moment of saving (the author may have turned the model while writing).
    create.mutate({ ...body, camera: cameraRef.current?.() ?? body.camera }, {
      onSuccess: (pin) => setSelected({ revisionId: revision.id, pinId: pin.id }),
      onError: (error) => {
        if (at) setDraft({ at, values, problem: describeError(error) });
      },
    });
  };

  const viewerOptions = useMemo<ViewerPins>(
    () => ({
      pins: viewerPins,
      selected: selectedId === null ? null : String(selectedId),
      onSelect: onMarker,
      canPlace,
      placing: canPlace && placing,
      onPlace,
      draft: draft?.at.anchor ?? null,
      view,
      cameraRef,
    }),
    [viewerPins, selectedId, onMarker, canPlace, placing, onPlace, draft, view],
  );

  const groups = report ? (report as { groups?: unknown }).groups : undefined;
  const emptyMessage = isOwner || viewer?.role === 'participant' ? "No comments yet; critics' pins appear here." : `No pins yet.${canPlace ? ' Place one with the button above or the P key.' : ''}`;

  return (
    <div className={compact ? 'grid items-start gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]' : 'grid items-start gap-5 xl:grid-cols-[minmax(0,1fr)_23rem]'}>
      <div className="min-w-0">
        {report ? (
          <Suspense fallback={<Spinner label="Loading the 3-D viewer…" />}>
            <ModelViewer
              design={revision.design}
              joints={report.joints}
              groups={groups}
              focus={focus}
              onClearFocus={onClearFocus}
              pins={viewerOptions}
              layout="stacked"
              compact={compact}
            />
          </Suspense>
        ) : (
          <p className="text-sm text-ink-soft">The model appears when the audit is done; the pins are listed here meanwhile.</p>
        )}
      </div>
      <div ref={panel} className="min-w-0 space-y-3" role="region" aria-label="Pins and threads">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h3 className="font-semibold">
            Pins{data ? ` (${data.pins.length})` : ''}
          </h3>
          {canPlace ? (
            <Button
              variant={placing ? 'primary' : 'secondary'}
              size="sm"
              aria-pressed={placing}
              aria-keyshortcuts="P"
              disabled={!report}
              onClick={() => (placing ? cancelPlacing() : setPlacing(true))}
            >
              {placing ? 'Placing… (Esc cancels)' : 'Place a pin (P)'}
            </Button>
          ) : null}
        </div>
        <div aria-live="polite" className="text-sm">
          {placing ? <p className="text-accent-strong">Click a piece on the model, or choose one with the arrow keys and press Enter.</p> : null}
          {news ? (
            <p className="flex flex-wrap items-center gap-2 text-ink-soft" data-testid="pin-news">
              {news}
              <button type="button" className="text-xs underline focus-visible:outline-2 focus-visible:outline-accent" onClick={() => setNews(null)}>
                Dismiss
              </button>
            </p>
          ) : null}
        </div>
        {data?.outdatedEarlier.length ? (
          <ul className="space-y-1 rounded-md border border-dashed border-rule-strong px-3 py-2 text-sm" data-testid="outdated-earlier">
            {data.outdatedEarlier.map((o) => (
              <li key={o.revisionId}>
                {plural(o.count, 'pin', 'pins')} stayed on revision {o.revisionNumber} (the piece changed).{' '}
                <Link to={`/revisions/${o.revisionId}`}>Open revision {o.revisionNumber}</Link>
              </li>
            ))}
          </ul>
        ) : null}
        {draft && canPlace ? (
          <NewPinForm key={`${draft.at.anchor.piece}:${draft.at.anchor.point.join(',')}`} draft={draft.at} initial={draft.values} problem={draft.problem} onSave={save} onCancel={cancelPlacing} />
        ) : null}
        {query.isPending ? (
          <ListSkeleton label="Loading the pins…" rows={2} />
        ) : query.isError && !data ? (
          <ErrorState title="The pins could not be loaded" error={query.error} onRetry={() => void query.refetch()} />
        ) : data ? (
          <>
            <PinList
              pins={pins}
              filters={filters}
              onFiltersChange={setFilters}
              selectedId={selectedId}
              onSelect={(pin) => selectPin(pin, true)}
              emptyMessage={emptyMessage}
            />
            {query.isError ? <p className="text-sm text-signal-error">The latest pins could not be fetched; showing what was loaded. {describeError(query.error)}</p> : null}
            <p className="font-mono text-xs text-ink-soft">New pins and replies appear by themselves (every {PIN_POLL_MS / 1000} s).</p>
          </>
        ) : null}
        {selectedPin ? (
          <PinThread
            key={selectedPin.id}
            pin={selectedPin}
            revisionId={revision.id}
            canReply={canTalk}
            canResolve={canTalk}
            canChangeCategory={!readOnly && viewer !== null && (selectedPin.author.id === viewer.id || viewer.role === 'instructor')}
            onShowView={report ? () => selectPin(selectedPin, true) : undefined}
            onClose={() => setSelected(null)}
          />
        ) : null}
      </div>
    </div>
  );
}
