import { useState } from 'react';
import type { CreateAlertRuleInput } from '@shared/contract/alerts.ts';
import { checkRuleForm, errorsFromServerMessage, type RuleFormState } from './rule-form-input.ts';

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
      setErrors(errorsFromServerMessage((error as Error).message));
    }
  }

  return { f, setF, set, err, errors, submit };
}
