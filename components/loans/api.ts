// Kits, loans and the counter call the API through the shared client.
export { ApiError, callApi, errorText } from '@/components/ui/api';
