import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { BinSchemeVersionRow } from '../../shared/api/catalog.ts';
import { BinSchemeEditor } from '../../src/features/part-types/components/bin-scheme-editor.tsx';
import { resetCsrf } from '../../src/lib/api-client.ts';
import { mockFetch, renderWithClient } from './render.tsx';

afterEach(() => {
  vi.unstubAllGlobals();
  resetCsrf();
});

const bins = [
  [100, 150],
  [150, 200],
  [200, 250],
  [250, 300],
].map(([hfeMin, hfeMax], i) => ({
  id: i + 1,
  position: i,
  code: 'ABCD'[i],
  label: `hFE ${hfeMin}–${hfeMax}`,
  hfeMin,
  hfeMax,
  vbeMinMv: null,
  vbeMaxMv: null,
  gapBeforeIntended: false,
}));

const version = (over: Partial<BinSchemeVersionRow> = {}): BinSchemeVersionRow => ({
  id: 11,
  partTypeId: 5,
  version: 1,
  note: null,
  current: true,
  lockedAt: null,
  lotCount: 0,
  locked: false,
  createdByName: 'Quentin Marsh',
  createdAt: '2026-01-05T10:00:00.000Z',
  bins,
  ...over,
});

const limits = { hfeMin: 100, hfeMax: 300 };

describe('BinSchemeEditor', () => {
  it('when a bin overlaps the one before, shows the error in that row and sends nothing', async () => {
    const fetchMock = mockFetch(() => undefined);
    renderWithClient(<BinSchemeEditor partTypeId={5} limits={limits} base={version()} baseIsCurrent />);
    const user = userEvent.setup();
    expect(screen.getByTestId('scheme-preview')).toHaveTextContent('pass the checks');

    const min3 = screen.getByLabelText('Bin 3 hFE min');
    await user.clear(min3);
    await user.type(min3, '190');

    const rowErrors = await screen.findByTestId('bin-3-errors');
    expect(rowErrors).toHaveTextContent('Bin 3 hFE min: overlaps the previous bin ("B"), which runs to 200');
    expect(min3).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByTestId('bin-2-errors')).toBeNull();
    expect(screen.getByTestId('scheme-preview')).toHaveTextContent('1 problem');

    await user.click(screen.getByRole('button', { name: 'Save as new version' }));
    expect(await screen.findByText(/Fix the problem marked in the rows above/)).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
    expect(min3).toHaveValue('190');
  });

  it('a bin reaching past the part limit is flagged live; a blank row is flagged only when saving', async () => {
    mockFetch(() => undefined);
    renderWithClient(<BinSchemeEditor partTypeId={5} limits={limits} base={version()} baseIsCurrent />);
    const user = userEvent.setup();
    const max4 = screen.getByLabelText('Bin 4 hFE max');
    await user.clear(max4);
    await user.type(max4, '320');
    expect(await screen.findByTestId('bin-4-errors')).toHaveTextContent("hFE max: hfeMax 320 is above the part's maximum hFE 300");

    await user.click(screen.getByRole('button', { name: '+ Add bin' }));
    expect(screen.getByLabelText('Bin 5 hFE min')).toHaveValue('320');
    expect(screen.queryByTestId('bin-5-errors')).toBeNull();
    await user.click(screen.getByRole('button', { name: 'Save as new version' }));
    expect(await screen.findByTestId('bin-5-errors')).toHaveTextContent('Bin 5 Code: code must not be empty');
  });

  it('shows a server field error (bins[i].field) in its row and keeps the typed values', async () => {
    mockFetch((url, init) => {
      if (url === '/api/auth/csrf') return { status: 200, body: { csrfToken: 't' } };
      if (url === '/api/part-types/5/bin-schemes' && init?.method === 'POST') {
        return {
          status: 400,
          body: {
            type: 'x',
            title: 'Bad request',
            status: 400,
            detail: 'Check bins[1].label.',
            errors: [{ field: 'bins[1].label', message: 'label must have at most 80 characters' }],
          },
        };
      }
    });
    renderWithClient(<BinSchemeEditor partTypeId={5} limits={limits} base={version({ locked: true, lotCount: 2 })} baseIsCurrent />);
    const user = userEvent.setup();
    expect(screen.queryByRole('button', { name: /Save changes to version/ })).toBeNull();
    const label2 = screen.getByLabelText('Bin 2 Label');
    await user.type(label2, ' extra');
    await user.click(screen.getByRole('button', { name: 'Save as new version' }));
    expect(await screen.findByTestId('bin-2-errors')).toHaveTextContent('Bin 2 Label: label must have at most 80 characters');
    expect(label2).toHaveValue('hFE 150–200 extra');
  });

  it('when the version got locked meanwhile (409 scheme-locked), offers to save as a new version', async () => {
    const fetchMock = mockFetch((url, init) => {
      if (url === '/api/auth/csrf') return { status: 200, body: { csrfToken: 't' } };
      if (url === '/api/part-types/5/bin-schemes/1' && init?.method === 'PUT') {
        return { status: 409, body: { type: 'x', title: 'Conflict', status: 409, code: 'scheme-locked', detail: 'Scheme version 1 can no longer change because 1 lot uses it.' } };
      }
      if (url === '/api/part-types/5/bin-schemes' && init?.method === 'POST') return { status: 201, body: version({ id: 12, version: 2 }) };
    });
    const onSaved = vi.fn();
    renderWithClient(<BinSchemeEditor partTypeId={5} limits={limits} base={version()} baseIsCurrent onSaved={onSaved} />);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Save changes to version 1' }));
    expect(await screen.findByText(/1 lot uses it/)).toBeInTheDocument();
    const notice = screen.getByText('This version can no longer change').closest('[role="status"]') as HTMLElement;
    await user.click(notice.querySelector('button') as HTMLButtonElement);
    await waitFor(() => expect(onSaved).toHaveBeenCalledWith(expect.objectContaining({ version: 2 })));
    const post = fetchMock.mock.calls.find(([u, i]) => u === '/api/part-types/5/bin-schemes' && i?.method === 'POST')!;
    expect(JSON.parse(post[1]!.body as string).bins).toHaveLength(4);
  });
});
