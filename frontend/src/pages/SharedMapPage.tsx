import { EmptyPage } from '../components/EmptyPage';

export function SharedMapPage() {
  return (
    <EmptyPage title="Shared map">
      A viewing link opens a read-only map here, computed in your browser. No account is needed.
    </EmptyPage>
  );
}
