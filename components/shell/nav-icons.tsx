import {
  ArrowLeftRight,
  BookOpen,
  Boxes,
  CalendarDays,
  Ellipsis,
  Gauge,
  Package,
  ScanLine,
  Settings,
  ShoppingBasket,
  Users,
  X,
  type LucideIcon,
} from 'lucide-react';
import type { NavItem } from './nav-items';

// The sections' icons, drawn on the server and handed to the phone navigation (a client component) as
// ready elements: the icon library's code then stays out of the JavaScript every signed-in page downloads.
const ICONS: Record<string, LucideIcon> = {
  '/today': CalendarDays,
  '/scan': ScanLine,
  '/bench-check': Gauge,
  '/shelf': Package,
  '/kits': Boxes,
  '/loans': ArrowLeftRight,
  '/counter': ShoppingBasket,
  '/books': BookOpen,
  '/people': Users,
  '/settings': Settings,
};

export type PhoneNavIcons = {
  sections: Record<string, React.ReactNode>;
  more: React.ReactNode;
  close: React.ReactNode;
};

export function phoneNavIcons(items: NavItem[]): PhoneNavIcons {
  const sections: Record<string, React.ReactNode> = {};
  for (const n of items) {
    const Icon = ICONS[n.href] ?? Package;
    sections[n.href] = <Icon aria-hidden className="size-5 shrink-0" />;
  }
  return {
    sections,
    more: <Ellipsis aria-hidden className="size-5" />,
    close: <X aria-hidden className="size-5" />,
  };
}
