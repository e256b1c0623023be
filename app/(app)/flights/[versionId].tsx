/** Route /flights/:versionId: the leg sheet of a signed-off version. */
import { lazyScreen } from '../../../components/app/lazy-screen';

export default lazyScreen('field', (m) => m.LegSheetScreen);
