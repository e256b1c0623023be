/** Route /outbox: the development outbox (owners, fake SMTP only). */
import { OutboxScreen } from '../../components/outbox/outbox-screen';

export default OutboxScreen;
