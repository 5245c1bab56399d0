import { TextField } from '../../../components/ui/text-field';

export type PersonDetails = {
  name: string;
  email: string;
  licenceNumber: string;
  jurisdiction: string;
};

type FieldProps = {
  values: PersonDetails;
  onChange: (key: keyof PersonDetails) => (e: { target: { value: string } }) => void;
  errors: Record<string, string | undefined>;
};

/** Name and e-mail, as adding and editing a person both ask for them. */
export function NameEmailFields({ values, onChange, errors }: FieldProps) {
  return (
    <>
      <TextField
        label="Name"
        name="name"
        value={values.name}
        onChange={onChange('name')}
        error={errors.name}
      />
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="off"
        value={values.email}
        onChange={onChange('email')}
        error={errors.email}
      />
    </>
  );
}

/** Licence number and jurisdiction: a principal needs both to seal. */
export function LicenceFields({
  values,
  onChange,
  errors,
  labelSuffix = '',
  licenceHint,
}: FieldProps & { labelSuffix?: string; licenceHint?: string }) {
  return (
    <>
      <TextField
        label={`Licence no.${labelSuffix}`}
        name="licenceNumber"
        mono
        hint={licenceHint}
        value={values.licenceNumber}
        onChange={onChange('licenceNumber')}
        error={errors.licenceNumber}
      />
      <TextField
        label={`Jurisdiction${labelSuffix}`}
        name="jurisdiction"
        value={values.jurisdiction}
        onChange={onChange('jurisdiction')}
        error={errors.jurisdiction}
      />
    </>
  );
}
