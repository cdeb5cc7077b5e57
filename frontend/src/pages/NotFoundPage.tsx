import { Button } from 'antd';
import { Link, useLocation } from 'react-router-dom';
import { EmptyPage } from '../components/EmptyPage';

export function NotFoundPage() {
  const { pathname } = useLocation();
  return (
    <EmptyPage
      title="Nothing at this address"
      action={
        <Link to="/maps">
          <Button type="primary">Go to the maps</Button>
        </Link>
      }
    >
      There is no page at <code>{pathname}</code>. The link may be mistyped, or the map it pointed to was removed.
    </EmptyPage>
  );
}
