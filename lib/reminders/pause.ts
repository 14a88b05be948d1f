/** The shortest time between two reminders of one loan, manual or scheduled. */
export const REMINDER_PAUSE_HOURS = 12;
