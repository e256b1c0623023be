/** Route /flights/:versionId: the leg sheet of a signed-off version. */
import { LegSheetScreen } from '../../../components/flights/leg-sheet-screen';

export default LegSheetScreen;
