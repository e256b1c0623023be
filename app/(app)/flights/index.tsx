/** Route /flights. */
import { FlightsScreen } from '../../../components/flights/flights-screen';

export default FlightsScreen;
