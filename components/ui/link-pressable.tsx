/** A pressable that is a real link on the web (an <a href>), with hover/focus/pressed styling like any Pressable. */
import { useRouter, type Href } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, type GestureResponderEvent, type PressableStateCallbackType, type StyleProp, type ViewStyle } from 'react-native';

/** React Native Web adds hover and focus to the pressable state; native only has `pressed`. */
export type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

type LinkPressableProps = {
  href: Href & string;
  children: ReactNode;
  style: (state: WebPressState) => StyleProp<ViewStyle>;
  testID?: string;
  /** Extra ARIA props React Native's types do not list (e.g. aria-current). */
  aria?: object;
  accessibilityLabel?: string;
};

type WebClick = GestureResponderEvent & { metaKey?: boolean; ctrlKey?: boolean; shiftKey?: boolean; preventDefault?: () => void };

/**
 * expo-router's `<Link asChild>` flattens a child's style function away, so navigation items that need hover and
 * focus states use this instead: the href keeps open-in-new-tab working, a plain click routes inside the app.
 */
export function LinkPressable({ href, children, style, testID, aria, accessibilityLabel }: LinkPressableProps) {
  const router = useRouter();
  const onPress = (event: WebClick) => {
    if (event.metaKey || event.ctrlKey || event.shiftKey) return; // let the browser open a new tab or window
    event.preventDefault?.();
    router.push(href);
  };
  return (
    <Pressable
      role="link"
      {...({ href } as object)}
      {...(aria ?? {})}
      aria-label={accessibilityLabel}
      testID={testID}
      onPress={onPress}
      style={style as (state: PressableStateCallbackType) => StyleProp<ViewStyle>}
    >
      {children}
    </Pressable>
  );
}
