/**
 * A list that screen readers count ("list, 4 items"): every child is wrapped in a list item, so rows that are
 * links, buttons or checkboxes keep their own role inside one (a list's direct children must be list items).
 */
import { Children, type ReactNode } from 'react';
import { View, type StyleProp, type ViewStyle } from 'react-native';

type ListProps = { label?: string; testID?: string; style?: StyleProp<ViewStyle>; itemStyle?: StyleProp<ViewStyle>; children: ReactNode };

export function List({ label, testID, style, itemStyle, children }: ListProps) {
  return (
    <View role="list" aria-label={label} testID={testID} style={style}>
      {Children.toArray(children).map((child, i) => (
        <View role="listitem" key={(child as { key?: string | null }).key ?? i} style={itemStyle}>
          {child}
        </View>
      ))}
    </View>
  );
}
