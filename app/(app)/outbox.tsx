/** Route /outbox: the development outbox (owners, fake SMTP only). */
import { lazyScreen } from '../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.OutboxScreen);
