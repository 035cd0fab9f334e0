import { getInputProps, type FieldMetadata } from "@conform-to/react";
import type { InputHTMLAttributes, ReactNode } from "react";

/** A labelled form control with its hint and its error, the error tied to the input for screen readers. */
export function Field({
  id,
  label,
  hint,
  errors,
  children,
}: {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  errors?: string[];
  children: ReactNode;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      )}
      {children}
      {errors?.length ? (
        <p id={`${id}-error`} role="alert" className="flex items-start gap-2 font-bold text-fault">
          <span aria-hidden="true">▲</span>
          <span>{errors.join(" ")}</span>
        </p>
      ) : null}
    </div>
  );
}

export function FormErrors({ errors }: { errors?: string[] | null }) {
  if (!errors?.length) return null;
  return (
    <div role="alert" className="rounded-md border-2 border-fault bg-fault-light p-3 font-bold text-fault">
      {errors.join(" ")}
    </div>
  );
}

export interface FormErrorsData {
  errors?: string[] | null;
}

/** A Conform field's text-like input inside its labelled Field, with its hint and errors. */
export function InputField<Schema>({
  meta,
  type = "text",
  label,
  hint,
  className = "field-input",
  ...input
}: {
  meta: FieldMetadata<Schema, Record<string, unknown>, string[]>;
  type?: "text" | "date" | "email" | "password" | "file" | "search" | "tel";
  label: ReactNode;
  hint?: ReactNode;
} & Omit<InputHTMLAttributes<HTMLInputElement>, "type" | "name" | "id">) {
  return (
    <Field id={meta.id} label={label} hint={hint} errors={meta.errors}>
      <input {...getInputProps(meta, { type })} className={className} {...input} />
    </Field>
  );
}
