import { Typography } from 'antd';
import { Link } from 'react-router-dom';
import { useMailbox } from '../api/mailbox';

/** On development servers the e-mail goes to the local mail fake: say where to read it. */
export function LocalMailboxHint() {
  const { data } = useMailbox();
  if (!data?.available) return null;
  return (
    <Typography.Text type="secondary">
      This server keeps e-mail locally: <Link to="/dev/mailbox">open the local mailbox</Link>.
    </Typography.Text>
  );
}
