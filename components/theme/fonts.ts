/** The font files shipped inside the build, one import per weight so unused weights stay out of the bundle. */
import { Inter_400Regular } from '@expo-google-fonts/inter/400Regular';
import { Inter_500Medium } from '@expo-google-fonts/inter/500Medium';
import { Inter_600SemiBold } from '@expo-google-fonts/inter/600SemiBold';
import { Inter_700Bold } from '@expo-google-fonts/inter/700Bold';
import { JetBrainsMono_400Regular } from '@expo-google-fonts/jetbrains-mono/400Regular';
import { JetBrainsMono_500Medium } from '@expo-google-fonts/jetbrains-mono/500Medium';
import { fontFamilies } from './tokens';

/** Family name → font file, in the form `useFonts` from expo-font takes; the names match `fontFamilies`. */
export const fontFiles = {
  [fontFamilies.regular]: Inter_400Regular,
  [fontFamilies.medium]: Inter_500Medium,
  [fontFamilies.semibold]: Inter_600SemiBold,
  [fontFamilies.bold]: Inter_700Bold,
  [fontFamilies.mono]: JetBrainsMono_400Regular,
  [fontFamilies.monoMedium]: JetBrainsMono_500Medium,
};
