import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, render, screen } from '@testing-library/react';
import { fieldLabel } from '@shared/contract/words/fields.ts';
import { ChannelFields, type ChannelFieldName } from './channel-fields.tsx';

afterEach(cleanup);

const register = (name: string) => ({ name, onChange: async () => {}, onBlur: async () => {}, ref: () => {} });

describe('ChannelFields', () => {
  it('names each box as the server names the field in its refusals, so "Lowest valid value (2nd channel): …" points at a box of that name', () => {
    render(<ChannelFields position={2} register={register} errors={undefined} />);
    const names: ChannelFieldName[] = ['key', 'label', 'unit', 'quantity', 'validMin', 'validMax', 'seasonalPeriodHint'];
    for (const name of names) {
      // the server's label for `channels.1.<name>` of `POST …/loggers` (server/contract/words/fields.ts)
      expect(screen.getByLabelText(fieldLabel(['channels', 1, name], '/loggers'))).toBeTruthy();
    }
    expect(screen.getByLabelText('Expected time between readings in seconds (2nd channel)')).toBeTruthy();
  });
});
