import { useState } from 'react';
import type { CreateAlertRuleInput } from '@shared/contract/alerts.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { checkRuleForm, errorsFromServerMessage, placeRuleErrors, type RuleFormState } from './rule-form-input.ts';

/**
 * The state both rule forms (new and change) keep: the typed fields, the refusal per field, and
 * a submit that checks the fields with the server's own schema before `send` runs and puts the
 * server's refusals on the fields they name.
 */
export function useRuleForm(initial: () => RuleFormState) {
  const [f, setF] = useState<RuleFormState>(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const set =
    <K extends keyof RuleFormState>(key: K) =>
    (e: { target: { value: string } }) =>
      setF((old) => ({ ...old, [key]: e.target.value as RuleFormState[K] }));
  const err = (key: string): string | undefined => errors[key];

  async function submit(send: (input: CreateAlertRuleInput) => Promise<void>): Promise<void> {
    const checked = checkRuleForm(f);
    if ('errors' in checked) return setErrors(checked.errors);
    setErrors({});
    try {
      await send(checked.input);
    } catch (error) {
      // the answer's refused fields by key when it names them; the old `key: reason` text otherwise
      setErrors(
        error instanceof ApiError && error.fields.length > 0
          ? placeRuleErrors(error.fields.map((p) => ({ path: p.field === '' ? [] : p.field.split('.'), reason: p.reason })))
          : errorsFromServerMessage((error as Error).message),
      );
    }
  }

  return { f, setF, set, err, errors, submit };
}
