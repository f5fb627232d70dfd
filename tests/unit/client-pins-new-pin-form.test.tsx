// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { createPinBodySchema } from '../../shared/api/critique.js';
import { NewPinForm, type PinDraft } from '../../src/features/pins/components/new-pin-form.js';

afterEach(cleanup);

const draft: PinDraft = {
  anchor: { piece: 'keel-07', point: [14.25, -3.5], side: -1 },
  camera: { position: [420, -310, 180], target: [0, 0, 35] },
  orbitSize: 60,
};

function renderForm(d: PinDraft = draft) {
  const onSave = vi.fn();
  const onCancel = vi.fn();
  render(<NewPinForm draft={d} onSave={onSave} onCancel={onCancel} />);
  return { onSave, onCancel };
}

describe('NewPinForm', () => {
  it('names the piece and the face the pin goes on', () => {
    renderForm();
    expect(screen.getByRole('heading').textContent).toBe('New pin on keel-07');
    expect(screen.getByTestId('new-pin-form').textContent).toContain('back face');
  });

  it('refuses an empty comment at the field', () => {
    const { onSave } = renderForm();
    fireEvent.click(screen.getByRole('button', { name: 'Save pin' }));
    expect(screen.getByText('Write a comment')).toBeTruthy();
    expect(screen.getByLabelText('Comment').getAttribute('aria-invalid')).toBe('true');
    expect(onSave).not.toHaveBeenCalled();
  });

  it('saves the anchor, the camera, the category, the scope and the comment as the create body', () => {
    const { onSave } = renderForm();
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'fabrication' } });
    fireEvent.click(screen.getByLabelText('Every piece of its orbit (60 pieces)'));
    fireEvent.change(screen.getByLabelText('Comment'), { target: { value: '  Slot **too tight** for 3 mm.  ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save pin' }));
    expect(onSave).toHaveBeenCalledTimes(1);
    const body = onSave.mock.calls[0][0];
    expect(body).toEqual({
      anchor: { piece: 'keel-07', point: [14.25, -3.5], side: -1 },
      scope: 'orbit',
      category: 'fabrication',
      camera: { position: [420, -310, 180], target: [0, 0, 35] },
      body: 'Slot **too tight** for 3 mm.',
    });
    expect(createPinBodySchema.safeParse(body).success).toBe(true);
  });

  it('offers the orbit only when the motif has more than one piece', () => {
    renderForm({ ...draft, orbitSize: 1 });
    expect((screen.getByLabelText('Every piece of its orbit (1 piece)') as HTMLInputElement).disabled).toBe(true);
    expect((screen.getByLabelText('This piece') as HTMLInputElement).checked).toBe(true);
  });

  it('Escape and Cancel both drop the pin', () => {
    const { onCancel } = renderForm();
    fireEvent.keyDown(screen.getByLabelText('Comment'), { key: 'Escape' });
    expect(onCancel).toHaveBeenCalledTimes(1);
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(onCancel).toHaveBeenCalledTimes(2);
  });
});
