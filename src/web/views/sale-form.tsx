/**
 * Add or edit one sale. Field names are the CSV column names, so the same validateSale
 * checks a form post and a file row, and its messages land beside the matching input.
 */
import { CHARACTERISTICS, CHARACTERISTIC_RULES, type Sale } from '../../domain/sale.js';
import { MAX_TEXT_LENGTH, type FieldErrors, type RawFields } from '../../domain/validate-sale.js';
import type { Market } from '../../store/markets-repo.js';
import type { StoredSale } from '../../store/sales-repo.js';
import { ErrorSummary, Field } from './field.js';
import { areaLabel } from './format.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { CsrfField } from './csrf-field.js';

export interface SaleFormProps {
  market: Market;
  /** Undefined when adding. */
  sale?: StoredSale;
  values: RawFields;
  errors: FieldErrors;
}

/** A stored sale as the text a form shows. */
export function saleValues(s: Sale): RawFields {
  const v: RawFields = {
    id: s.id,
    address: s.address,
    sale_date: s.saleDate,
    sale_price: String(s.salePrice),
    verification: s.verification ?? '',
    notes: s.notes ?? '',
    included: s.included ? 'yes' : 'no',
    excluded_reason: s.excludedReason ?? '',
  };
  for (const c of CHARACTERISTICS) v[c] = s.characteristics[c] === undefined ? '' : String(s.characteristics[c]);
  return v;
}

/** The unit beside a characteristic's input; an empty one keeps the grid's inputs the same width. */
function unitOf(market: Market, unit: (typeof CHARACTERISTIC_RULES)[keyof typeof CHARACTERISTIC_RULES]['unit']): string {
  return unit === 'area' ? areaLabel(market.areaUnit) : '';
}

export function SaleForm(p: SaleFormProps) {
  const { market, values, errors } = p;
  const action = p.sale ? `/markets/${market.id}/sales/${p.sale.key}` : `/markets/${market.id}/sales`;
  const included = (values.included ?? 'yes') !== 'no';
  return (
    <form id="sale-form" class="form sale-form" method="post" action={action} hx-post={action} hx-target="this" hx-swap="outerHTML" novalidate>
      <CsrfField />
      <ErrorSummary errors={errors} />
      <fieldset>
        <legend>The sale</legend>
        <Field name="address" label="Address" value={values.address} error={errors.address} required maxlength={MAX_TEXT_LENGTH.address} autofocus />
        <Field name="sale_date" label="Sale date" type="date" value={values.sale_date} error={errors.sale_date} required />
        <Field name="sale_price" label="Sale price" inputmode="decimal" value={values.sale_price} error={errors.sale_price} unit={market.currency} required />
        <Field
          name="id"
          label="Reference"
          value={values.id}
          error={errors.id}
          maxlength={MAX_TEXT_LENGTH.id}
          hint={p.sale ? 'Your own reference, unique in this market.' : 'Your own reference, unique in this market; left empty, one like S-0001 is given.'}
        />
      </fieldset>
      <fieldset>
        <legend>Characteristics</legend>
        <div class="grid">
          {CHARACTERISTICS.map((c) => {
            const rule = CHARACTERISTIC_RULES[c];
            return (
              <Field
                name={c}
                label={rule.label}
                inputmode={rule.integer ? 'numeric' : 'decimal'}
                value={values[c]}
                error={errors[c]}
                unit={unitOf(market, rule.unit)}
                hint={rule.unit === 'bath' ? 'A half bath counts 0.5.' : undefined}
              />
            );
          })}
        </div>
      </fieldset>
      <fieldset>
        <legend>Verification and status</legend>
        <Field name="verification" label="Verification" value={values.verification} error={errors.verification} maxlength={MAX_TEXT_LENGTH.verification} hint="How the sale was confirmed, e.g. deed and buyer interview." />
        <Field name="notes" label="Notes" value={values.notes} error={errors.notes} multiline maxlength={MAX_TEXT_LENGTH.notes} />
        <div class={`field${errors.included ? ' has-error' : ''}`}>
          <label for="f-included">Use in estimates</label>
          <div class="control">
            <select id="f-included" name="included" aria-invalid={errors.included ? 'true' : undefined} aria-describedby={errors.included ? 'f-included-error' : undefined}>
              <option value="yes" selected={included}>
                Included
              </option>
              <option value="no" selected={!included}>
                Excluded
              </option>
            </select>
          </div>
          {errors.included ? (
            <p class="error" id="f-included-error">
              {errors.included}
            </p>
          ) : null}
        </div>
        <Field name="excluded_reason" label="Reason for excluding" value={values.excluded_reason} error={errors.excluded_reason} maxlength={MAX_TEXT_LENGTH.excluded_reason} hint="Needed when the sale is excluded." />
      </fieldset>
      <div class="actions">
        <button type="submit">{p.sale ? 'Save sale' : 'Add sale'}</button>
        <a href={p.sale ? `/markets/${market.id}/sales/${p.sale.key}` : `/markets/${market.id}`}>Cancel</a>
      </div>
    </form>
  );
}

export function SaleFormPage(p: SaleFormProps) {
  const title = p.sale ? `Edit sale ${p.sale.id}` : 'Add a sale';
  return (
    <Layout title={`${title} · ${p.market.name}`}>
      <MarketHeader market={p.market} current={p.sale ? 'sales' : 'add'} />
      <h2>{title}</h2>
      <SaleForm {...p} />
    </Layout>
  );
}
