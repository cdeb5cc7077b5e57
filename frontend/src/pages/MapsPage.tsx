import { EmptyPage } from '../components/EmptyPage';

export function MapsPage() {
  return (
    <EmptyPage title="Your team's maps">
      Each map scans polarizability against magnetic field and shows where field-induced negative ions are bound,
      resonant or unbound. Saved maps of your research group are listed here.
    </EmptyPage>
  );
}
