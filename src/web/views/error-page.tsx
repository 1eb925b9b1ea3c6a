/** What a failed request shows: a full page, or a small fragment for htmx's #messages area. */
import { Layout } from './layout.js';

export function ErrorMessage(props: { status: number; message: string }) {
  return (
    <div class="error-summary" role="alert">
      <p>
        <strong>{props.status === 404 ? 'Not found.' : props.status >= 500 ? 'Something went wrong.' : 'That did not work.'}</strong> {props.message}
      </p>
    </div>
  );
}

export function ErrorPage(props: { status: number; message: string }) {
  return (
    <Layout title={props.status === 404 ? 'Not found' : 'Error'}>
      <h1>{props.status === 404 ? 'Not found' : 'Error'}</h1>
      <ErrorMessage status={props.status} message={props.message} />
      <p>
        <a href="/markets">Back to the markets</a>
      </p>
    </Layout>
  );
}
