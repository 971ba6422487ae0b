import { describe, expect, it } from 'vitest';
import { acknowledgeForm, closeForm, DEFAULT_ACTOR, firstProblem } from './flagForm';

describe('flag forms', () => {
  it('records an empty name as the default actor, and needs a note', () => {
    expect(acknowledgeForm.parse({ id: '42', by: '  ', note: ' Checked GNSS1 antenna cable ' })).toEqual({
      id: 42n,
      by: DEFAULT_ACTOR,
      note: 'Checked GNSS1 antenna cable',
    });
    const missing = acknowledgeForm.safeParse({ id: '42', by: 'Ana', note: '   ' });
    expect(missing.success).toBe(false);
    expect(firstProblem(missing.error!)).toBe('Note: write what was found or done');
  });

  it('takes only a known close reason and a real id', () => {
    expect(closeForm.parse({ id: '7', by: 'Ana Reyes', note: 'Thruster overhauled', reason: 'resolved' })).toMatchObject({ id: 7n, reason: 'resolved' });
    expect(closeForm.safeParse({ id: '7', note: 'x', reason: 'ignored' }).success).toBe(false);
    expect(closeForm.safeParse({ id: '7; DROP', note: 'x', reason: 'dismissed' }).success).toBe(false);
    expect(closeForm.safeParse({ id: '0', note: 'x', reason: 'dismissed' }).success).toBe(false);
  });
});
