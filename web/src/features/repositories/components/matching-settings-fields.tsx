import { INDEX_MIN_THRESHOLD } from '@shared/constants';
import { TextField } from '@/components/field';
import { optionalNumber, type FieldErrors } from '@/lib/form';

/** The values the matching fields start with. */
export interface MatchingSettingsValues {
  threshold: number;
  minTokens: number;
  shingleSize: number;
  cloneBudget: number | null;
}

/** Threshold, minimum tokens and shingle size, side by side: what the create and settings forms share. */
export function MatchingSettingsFields({ values, errors }: { values: MatchingSettingsValues; errors: FieldErrors }) {
  return (
    <div className="grid grid-cols-3 gap-2">
      <TextField
        label="Threshold"
        name="threshold"
        type="number"
        step="0.01"
        min={INDEX_MIN_THRESHOLD}
        max={1}
        defaultValue={values.threshold}
        error={errors.threshold}
      />
      <TextField label="Min tokens" name="minTokens" type="number" min={5} defaultValue={values.minTokens} error={errors.minTokens} />
      <TextField label="Shingle" name="shingleSize" type="number" min={1} max={10} defaultValue={values.shingleSize} error={errors.shingleSize} />
    </div>
  );
}

/** The clone budget as a share of tokens; empty means no budget. */
export function CloneBudgetField({ value, error }: { value: number | null; error?: string }) {
  return (
    <TextField
      label="Clone budget"
      name="cloneBudget"
      type="number"
      step="0.005"
      min={0}
      max={1}
      placeholder="none"
      defaultValue={value ?? ''}
      hint="A share of tokens, 0.05 = 5 %. Empty: no budget."
      error={error}
    />
  );
}

/** The matching fields of a submitted form, as numbers (undefined where left empty). */
export function readMatchingSettings(form: FormData) {
  return {
    threshold: optionalNumber(form.get('threshold')),
    minTokens: optionalNumber(form.get('minTokens')),
    shingleSize: optionalNumber(form.get('shingleSize')),
    cloneBudget: optionalNumber(form.get('cloneBudget')),
  };
}
