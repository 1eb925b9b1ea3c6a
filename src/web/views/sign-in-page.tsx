/** The sign-in page: name and password, for a compfit that other machines can reach. */
import { CsrfField } from './csrf-field.js';
import { Layout } from './layout.js';

export interface SignInProps {
  name: string;
  next: string;
  /** Why the last try failed: a wrong name or password, or too many tries. */
  error?: string;
}

export function SignInPage(p: SignInProps) {
  return (
    <Layout title="Sign in">
      <h1>Sign in</h1>
      <p class="lead">This compfit is shared over the network, so it needs your name and password.</p>
      <form class="form sign-in" method="post" action="/sign-in">
        <CsrfField />
        <input type="hidden" name="next" value={p.next} />
        {p.error ? (
          <div class="error-summary" role="alert">
            <p>{p.error}</p>
          </div>
        ) : null}
        <div class="field">
          <label for="f-name">
            Name<span class="required" aria-hidden="true"> *</span>
          </label>
          <div class="control">
            <input id="f-name" name="name" value={p.name} required maxlength={64} autocomplete="username" autofocus={!p.name} />
          </div>
        </div>
        <div class="field">
          <label for="f-password">
            Password<span class="required" aria-hidden="true"> *</span>
          </label>
          <div class="control">
            <input id="f-password" name="password" type="password" required autocomplete="current-password" autofocus={!!p.name} />
          </div>
        </div>
        <div class="actions">
          <button type="submit">Sign in</button>
        </div>
      </form>
      <p class="hint">
        No account yet? Whoever runs this server adds people with <code>compfit user add NAME</code>.
      </p>
    </Layout>
  );
}
