import { useQuery } from '@tanstack/react-query';
import { Alert, Card, EmptyState, PageHeader, Spinner } from '../../../components/ui/card';
import { shopQueries } from '../api/queries';
import { useFormat } from '../../../lib/format';

/** What the local fake mail receiver got: invitations, resets, reports. Development only. */
export function MailPage() {
  const mail = useQuery(shopQueries.mail());
  const fmt = useFormat();
  return (
    <div className="flex flex-col gap-4">
      <PageHeader title="Mail sent" subtitle="On this machine mail goes to a local receiver, not to the internet. This page lists what it received." />
      {mail.isLoading ? <Spinner /> : mail.error ? <Alert>{(mail.error as Error).message}</Alert> : mail.data?.length ? (
        <ul className="flex flex-col gap-3">
          {mail.data.map((m) => (
            <li key={m.id}>
              <Card as="article">
                <p className="text-sm text-ink-soft">{fmt.dateTime(m.receivedAt)} · to {m.to.join(', ')}</p>
                <h2 className="text-lg">{m.subject}</h2>
                <pre className="mt-2 whitespace-pre-wrap break-words font-sans text-base">{m.text}</pre>
              </Card>
            </li>
          ))}
        </ul>
      ) : <EmptyState title="No mail yet" />}
    </div>
  );
}
