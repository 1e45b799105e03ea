/** One choice in a filter select. */
export type FilterOption = { value: string; label: string };

export type FilterSelectProps = {
  /** The query parameter the form sends. */
  name: string;
  /** Visible label text. */
  label: string;
  /** The value chosen now ('' for none). */
  value: string;
  options: readonly FilterOption[];
  /** Text of a first, empty option ("Any setting"); leave out when a value is always chosen. */
  anyLabel?: string;
  /** Classes of the select itself (each filter bar sizes its selects). */
  selectClassName: string;
};

/** A labelled select in a GET filter form; its id is `filter-<name>`. Works without JavaScript. */
export function FilterSelect({ name, label, value, options, anyLabel, selectClassName }: FilterSelectProps) {
  const id = `filter-${name}`;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      <select id={id} name={name} defaultValue={value} className={selectClassName}>
        {anyLabel !== undefined ? <option value="">{anyLabel}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** Options from a list of codes and their labels, in the list's order. */
export function optionsOf<K extends string>(codes: readonly K[], labels: Readonly<Record<K, string>>): FilterOption[] {
  return codes.map((value) => ({ value, label: labels[value] }));
}
