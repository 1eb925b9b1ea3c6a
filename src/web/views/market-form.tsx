/** Create or edit a market: name, area unit, currency and notes. */
import type { FieldErrors, RawFields } from '../../domain/validate-sale.js';
import type { Market } from '../../store/markets-repo.js';
import { ErrorSummary, Field } from './field.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { CsrfField } from './csrf-field.js';

export interface MarketFormProps {
  /** Undefined when creating. */
  market?: Market;
  values: RawFields;
  errors: FieldErrors;
}

export function marketValues(m: Market): RawFields {
  return { name: m.name, area_unit: m.areaUnit, currency: m.currency, notes: m.notes ?? '' };
}

export function MarketForm(p: MarketFormProps) {
  const action = p.market ? `/markets/${p.market.id}` : '/markets';
  const unit = p.values.area_unit ?? 'sqft';
  return (
    <form id="market-form" class="form" method="post" action={action} hx-post={action} hx-target="this" hx-swap="outerHTML">
      <CsrfField />
      <ErrorSummary errors={p.errors} />
      <Field name="name" label="Name" value={p.values.name} error={p.errors.name} required maxlength={120} autofocus />
      <div class={`field${p.errors.area_unit ? ' has-error' : ''}`}>
        <label for="f-area_unit">Area unit</label>
        <div class="control">
          <select id="f-area_unit" name="area_unit" aria-describedby={p.errors.area_unit ? 'f-area_unit-error' : undefined}>
            <option value="sqft" selected={unit === 'sqft'}>
              square feet (sq ft)
            </option>
            <option value="m2" selected={unit === 'm2'}>
              square metres (m²)
            </option>
          </select>
        </div>
        {p.market ? <p class="hint">Changing the unit relabels the areas already recorded; it does not convert them.</p> : null}
        {p.errors.area_unit ? (
          <p class="error" id="f-area_unit-error">
            {p.errors.area_unit}
          </p>
        ) : null}
      </div>
      <Field
        name="currency"
        label="Currency"
        value={p.values.currency ?? 'USD'}
        error={p.errors.currency}
        required
        maxlength={3}
        hint="Three-letter code, e.g. USD, EUR, GBP, CAD."
      />
      <Field name="notes" label="Notes" value={p.values.notes} error={p.errors.notes} multiline maxlength={2000} />
      <div class="actions">
        <button type="submit">{p.market ? 'Save market' : 'Create market'}</button>
        <a href={p.market ? `/markets/${p.market.id}` : '/markets'}>Cancel</a>
      </div>
    </form>
  );
}

export function MarketFormPage(p: MarketFormProps) {
  return (
    <Layout title={p.market ? `Settings · ${p.market.name}` : 'New market'}>
      {p.market ? <MarketHeader market={p.market} current="settings" /> : <h1>New market</h1>}
      {p.market ? <h2>Market settings</h2> : null}
      <MarketForm {...p} />
    </Layout>
  );
}
