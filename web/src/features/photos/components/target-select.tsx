import { Field, Select } from '@fluentui/react-components';

import { targetKey, type TargetOption } from '../utils/photo-targets';
import type { PhotoTarget } from '@domain/photos/photo.schema';

type TargetSelectProps = {
  label: string;
  options: readonly TargetOption[];
  value: PhotoTarget;
  onChange: (target: PhotoTarget) => void;
  className?: string;
};

/** Picks what a photo shows: the job, a run, a depth reading, a piece of equipment or a wall entry. */
export function TargetSelect({ label, options, value, onChange, className }: TargetSelectProps) {
  const groups = [...new Set(options.map((option) => option.group))];
  return (
    <Field label={label}>
      <Select
        className={className}
        value={targetKey(value)}
        onChange={(_event, data) => {
          const next = options.find((option) => option.key === data.value);
          if (next) onChange(next.target);
        }}
      >
        {groups.map((group) => (
          <optgroup key={group} label={group}>
            {options
              .filter((option) => option.group === group)
              .map((option) => (
                <option key={option.key} value={option.key}>
                  {option.label}
                </option>
              ))}
          </optgroup>
        ))}
      </Select>
    </Field>
  );
}
