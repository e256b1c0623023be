/** The pilot's screens, fetched together on first use and kept on the device by the service worker for offline starts. */
export { FlightsScreen } from '../flights/flights-screen';
export { LegSheetScreen } from '../flights/leg-sheet-screen';
