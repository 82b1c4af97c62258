import { act, render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { lazyChart } from './lazy-chart';

function Drawn({ label }: { label: string }) {
  return <div role="img" aria-label={label} />;
}

describe('lazyChart', () => {
  it('shows the chart once its code has loaded, in a box of its height meanwhile', async () => {
    const Chart = lazyChart(() => Promise.resolve(Drawn), () => 'h-56');
    const { container } = render(<Chart label="ΔP against litres" />);
    expect(container.querySelector('.h-56')).not.toBeNull();
    expect(await screen.findByRole('img', { name: 'ΔP against litres' })).toBeTruthy();
  });

  it('says so when its code cannot be fetched (no signal), keeps the page, and loads it once back online', async () => {
    let online = false;
    const Chart = lazyChart(() => (online ? Promise.resolve(Drawn) : Promise.reject(new TypeError('Failed to fetch dynamically imported module'))), () => 'h-36');
    render(
      <div>
        <button type="button">Save reading</button>
        <Chart label="ΔP against litres, stage 1" />
        <Chart label="ΔP against litres, stage 2" />
      </div>,
    );
    expect(await screen.findAllByText(/The chart loads when the connection is back/)).toHaveLength(2);
    expect(screen.getByRole('button', { name: 'Save reading' })).toBeTruthy();
    online = true;
    await act(async () => {
      window.dispatchEvent(new Event('online'));
    });
    // both charts of the page come back, not only the first to hear the browser is online
    expect(await screen.findByRole('img', { name: 'ΔP against litres, stage 1' })).toBeTruthy();
    expect(await screen.findByRole('img', { name: 'ΔP against litres, stage 2' })).toBeTruthy();
    expect(screen.queryByText(/The chart loads when the connection is back/)).toBeNull();
  });
});
