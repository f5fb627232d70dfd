// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import type { Brief } from '../../shared/api/briefs.js';
import type { Material } from '../../shared/api/materials.js';
import { briefFormDefaults, briefFormSchema, type BriefFormValues } from '../../src/features/briefs/components/brief-form-schema.js';
import { BriefForm } from '../../src/features/briefs/components/brief-form.js';
import { describeConstraints, describeGroup } from '../../src/features/briefs/components/brief-words.js';
import { parseOrders } from '../../src/features/briefs/components/group-picker.js';
import { formatTimeLeft, fromLocalInput, toLocalInput } from '../../src/lib/format.js';

const materials: Material[] = [
  { id: 1, name: 'Birch plywood', thickness: 3, kerf: 0.2, cuttingSpeed: 15, density: 680, sheetSizes: [[600, 400]], prohibited: false, prohibitedReason: null, notes: '', createdAt: '', updatedAt: '' },
  { id: 2, name: 'PVC / vinyl', thickness: 3, kerf: 0.2, cuttingSpeed: null, density: null, sheetSizes: [], prohibited: true, prohibitedReason: 'Releases hydrogen chloride when cut.', notes: '', createdAt: '', updatedAt: '' },
];

function valid(): BriefFormValues {
  const v = briefFormDefaults(null, 1);
  v.title = 'Lantern';
  return v;
}
const issues = (r: ReturnType<typeof briefFormSchema.safeParse>) => Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));

describe('briefFormSchema', () => {
  it('turns the local deadline into an ISO instant and empty optional boxes into absent values', () => {
    const v = valid();
    v.deadline = '2026-05-01T17:00';
    const r = briefFormSchema.safeParse(v);
    expect(r.success).toBe(true);
    expect(r.data!.deadline).toBe(new Date('2026-05-01T17:00').toISOString());
    expect(r.data!.critiqueWindow).toBeNull();
    expect(r.data!.constraints.pieceCount).toBeUndefined();
    expect(r.data!.constraints.minJointLength).toBeUndefined();
  });

  it('keeps only the axis or only the normal of a family rule, as the mode says', () => {
    const v = valid();
    v.constraints.requiredFamilies = [{ group: '', mode: 'axis', axis: 3, normal: [0, 0, 1], offsetMin: 60, offsetMax: 160 }];
    v.constraints.allowedFamilies = [{ group: 'I', mode: 'normal', axis: 2, normal: [0.2, 0.5, 0.84], offsetMin: 40, offsetMax: 40 }];
    const r = briefFormSchema.safeParse(v);
    expect(r.success).toBe(true);
    expect(r.data!.constraints.requiredFamilies).toEqual([{ axis: 3, offsetMin: 60, offsetMax: 160 }]);
    expect(r.data!.constraints.allowedFamilies).toEqual([{ group: 'I', normal: [0.2, 0.5, 0.84], offsetMin: 40, offsetMax: 40 }]);
  });

  it('names the field of each problem', () => {
    const v = valid();
    v.title = '';
    v.deadline = '';
    v.critiqueWindow = { opensAt: '2026-05-03T10:00', closesAt: '' };
    v.constraints.allowedGroups = [];
    v.constraints.requiredFamilies = [{ group: '', mode: 'axis', axis: 3, normal: [0, 0, 1], offsetMin: 100, offsetMax: 50 }];
    v.constraints.pieceCount = { min: 30, max: 10 };
    const found = issues(briefFormSchema.safeParse(v));
    expect(found).toMatchObject({
      title: 'Enter a title',
      deadline: 'Choose a date and time',
      'critiqueWindow.closesAt': 'Choose when the critique closes, or clear both dates',
      'constraints.allowedGroups': 'Allow at least one group',
      'constraints.requiredFamilies.0.offsetMax': 'must not be smaller than offsetMin',
      'constraints.pieceCount.max': 'must not be smaller than min',
    });
  });

  it('reads an existing brief back into the same form values', () => {
    const v = valid();
    v.deadline = '2026-05-01T17:00';
    v.constraints.requiredFamilies = [{ group: '', mode: 'normal', axis: undefined, normal: [1, 0, 0], offsetMin: 10, offsetMax: 20 }];
    const body = briefFormSchema.safeParse(v).data!;
    const brief = { ...body, id: 4, studioId: 1, critiqueWindow: null, material: null, state: 'draft' } as unknown as Brief;
    const again = briefFormSchema.safeParse(briefFormDefaults(brief, 1));
    expect(again.data).toEqual(body);
  });
});

describe('brief words', () => {
  it('describes groups with their kind and order', () => {
    expect(describeGroup('I')).toBe('I (icosahedral)');
    expect(describeGroup('D5')).toBe('D5 (dihedral, order 10)');
    expect(describeGroup('C3')).toBe('C3 (cyclic, order 3)');
  });

  it('states the constraints in sentences', () => {
    const lines = describeConstraints(
      {
        allowedGroups: ['I'],
        requiredFamilies: [{ axis: 3, offsetMin: 60, offsetMax: 160 }],
        allowedFamilies: [],
        materialId: 1,
        sheet: [600, 400],
        maxSheets: 3,
        angleToleranceDeg: 0.5,
      },
      { name: 'Birch plywood', thickness: 3, kerf: 0.2 },
    );
    expect(lines).toEqual([
      'Use the symmetry group I (icosahedral).',
      'Required: planes square to the 3-fold axes, 60–160 mm from the centre.',
      'No families other than the required ones.',
      'Material: Birch plywood, 3 mm thick, kerf 0.2 mm.',
      'At most 3 sheets of 600 × 400 mm.',
      'Joints must be square within 0.5°.',
      'Joints at least twice the material thickness long.',
    ]);
  });

  it('reads lists of orders for C<n> and D<n>', () => {
    expect(parseOrders('3, 5 5;8', 2)).toEqual([3, 5, 8]);
    expect(parseOrders('1', 2)).toBeNull();
    expect(parseOrders('2.5', 1)).toBeNull();
    expect(parseOrders('', 1)).toEqual([]);
  });
});

describe('date helpers', () => {
  it('round-trips a datetime-local value', () => {
    const iso = fromLocalInput('2026-03-04T09:30')!;
    expect(toLocalInput(iso)).toBe('2026-03-04T09:30');
    expect(fromLocalInput('soon')).toBeNull();
  });

  it('says how long is left, and how long ago once past', () => {
    const now = Date.parse('2026-03-01T12:00:00Z');
    expect(formatTimeLeft('2026-03-03T15:00:00Z', now)).toBe('2 days 3 hours left');
    expect(formatTimeLeft('2026-03-01T13:05:00Z', now)).toBe('1 hour 5 minutes left');
    expect(formatTimeLeft('2026-03-01T12:00:20Z', now)).toBe('1 minute left');
    expect(formatTimeLeft('2026-02-28T12:00:00Z', now)).toBe('passed 1 day ago');
    expect(formatTimeLeft('2026-03-01T12:00:00Z', now)).toBe('passed just now');
  });
});

describe('BriefForm', () => {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => {
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });
  const renderForm = (onSaved = vi.fn()) => {
    const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
    render(
      <QueryClientProvider client={client}>
        <BriefForm studioId={1} brief={null} materials={materials} onSaved={onSaved} />
      </QueryClientProvider>,
    );
    return onSaved;
  };

  it('offers prohibited materials only as disabled choices with their reason', () => {
    renderForm();
    const option = screen.getByRole<HTMLOptionElement>('option', { name: /PVC \/ vinyl/ });
    expect(option.disabled).toBe(true);
    expect(option.textContent).toContain('Releases hydrogen chloride');
    expect(screen.getByText(/cannot be chosen/)).toBeTruthy();
  });

  it('when the title is missing, says so at the field and sends nothing', async () => {
    renderForm();
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(await screen.findByText('Enter a title')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('puts a server message about a nested constraint at that field', async () => {
    fetchMock.mockResolvedValue(
      new Response(JSON.stringify({ error: { code: 'invalid', message: 'Some values were not accepted.', fields: { 'body.constraints.maxSheets': 'the space has 2 lasers; at most 40 sheets' } } }), {
        status: 400,
        headers: { 'Content-Type': 'application/json' },
      }),
    );
    const onSaved = renderForm();
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Lantern' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(await screen.findByText('the space has 2 lasers; at most 40 sheets')).toBeTruthy();
    expect(screen.getByLabelText('Maximum sheets').getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByRole('status').textContent).toContain('Some values were not accepted.');
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/studios/1/briefs');
    const sent = JSON.parse(String(init?.body));
    expect(sent.title).toBe('Lantern');
    expect(sent.constraints.materialId).toBe(1);
    expect(onSaved).not.toHaveBeenCalled();
  });

  it('when published, creates the draft and then publishes it', async () => {
    let brief: Record<string, unknown> = {};
    const answer = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
    fetchMock
      .mockImplementationOnce(async (_url, init) => {
        brief = { ...JSON.parse(String(init?.body)), id: 9, studioId: 1, state: 'draft', material: null };
        return answer(201, brief);
      })
      .mockImplementationOnce(async () => answer(200, { ...brief, state: 'published' }));
    const onSaved = renderForm();
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Lantern' } });
    fireEvent.click(screen.getByRole('button', { name: 'Publish brief' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(fetchMock.mock.calls.map(([u, i]) => `${i?.method} ${u}`)).toEqual(['POST /api/studios/1/briefs', 'POST /api/briefs/9/publish']);
    expect(onSaved.mock.calls[0][1]).toBe('publish');
    expect(screen.getByRole('status').textContent).toContain('Published “Lantern”.');
  });
});
