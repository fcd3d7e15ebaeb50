import { act, fireEvent, render, screen } from '@testing-library/react';
import { useState } from 'react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { useSendWhenTypingPauses } from '../../src/lib/use-send-when-typing-pauses';

// The search boxes of the units roster and the repair queue send their text when typing pauses; a person
// who follows a link before that has gone on, and the late send must not bring them back to the list.
function Box({ send }: { send: (v: string) => void }) {
  const [text, setText] = useState('');
  const [sent, setSent] = useState('');
  useSendWhenTypingPauses(text, text !== sent, (v) => (setSent(v), send(v)), 250);
  return (
    <div>
      <input aria-label="Road number" value={text} onChange={(e) => setText(e.target.value)} />
      <a href="/units/1" onClick={(e) => e.preventDefault()}>
        <span>HRL 4101</span>
      </a>
      <button type="button">Not a link</button>
    </div>
  );
}

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe('sending a search when typing pauses', () => {
  it('sends once, the pause after the last keystroke', () => {
    const send = vi.fn();
    render(<Box send={send} />);
    fireEvent.change(screen.getByLabelText('Road number'), { target: { value: '41' } });
    act(() => void vi.advanceTimersByTime(200));
    fireEvent.change(screen.getByLabelText('Road number'), { target: { value: '4101' } });
    act(() => void vi.advanceTimersByTime(200));
    expect(send).not.toHaveBeenCalled();
    act(() => void vi.advanceTimersByTime(100));
    expect(send.mock.calls).toEqual([['4101']]);
  });

  it('does not send when a link is followed before the pause ends (a tap on the text inside it counts)', () => {
    const send = vi.fn();
    render(<Box send={send} />);
    fireEvent.change(screen.getByLabelText('Road number'), { target: { value: '4101' } });
    fireEvent.click(screen.getByText('HRL 4101'));
    act(() => void vi.advanceTimersByTime(1000));
    expect(send).not.toHaveBeenCalled();
  });

  it('still sends after a click that is not on a link', () => {
    const send = vi.fn();
    render(<Box send={send} />);
    fireEvent.change(screen.getByLabelText('Road number'), { target: { value: '4101' } });
    fireEvent.click(screen.getByRole('button', { name: 'Not a link' }));
    act(() => void vi.advanceTimersByTime(300));
    expect(send.mock.calls).toEqual([['4101']]);
  });
});
