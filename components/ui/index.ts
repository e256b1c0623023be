/** UI atoms re-exported from one place. */
export { Badge, type BadgeTone } from './badge';
export { Banner } from './banner';
export { Button, type ButtonVariant } from './button';
export { Card } from './card';
export { ChoiceGroup } from './choice-group';
export { EmptyState } from './empty-state';
export { List } from './list';
export { Loading } from './loading';
export { Screen } from './screen';
export { TextField } from './text-field';
export { TextLink } from './text-link';
export { LinkPressable, type WebPressState } from './link-pressable';
export { Heading, Text, type TextTone } from './text';
export { FormTextField } from './form-text-field';
